import { describe, expect, it } from 'vitest';
import { formatDateTime } from './format';

describe('formatDateTime', () => {
  // The reference is the runtime's own Date.prototype.toLocaleString with the same options (ECMA-402), which
  // the kept formatter replaced: the same text for every moment, in whatever locale the tests run.
  it('writes a moment as toLocaleString does with the date and time styles', () => {
    for (const iso of [
      '2026-12-04T05:06:07.000Z',
      '1999-12-31T23:59:59.999Z',
      '2030-02-28T12:00:00+05:30',
      '2024-02-29T00:00:00.000Z'
    ])
      expect(formatDateTime(iso)).toBe(
        new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })
      );
  });

  it('writes a moment it cannot read as toLocaleString does, without throwing', () => {
    expect(formatDateTime('not a date')).toBe(new Date('not a date').toLocaleString());
    expect(formatDateTime('not a date')).toBe('Invalid Date');
  });
});
