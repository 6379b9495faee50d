import { describe, expect, it } from 'vitest';
import { addMonths, isPeriod, periodsOfQuarter, quarterOf } from './period';

describe('periods', () => {
  it('recognises only YYYY-MM months', () => {
    expect(isPeriod('2026-01')).toBe(true);
    expect(isPeriod('2026-12')).toBe(true);
    expect(isPeriod('2026-13')).toBe(false);
    expect(isPeriod(202601)).toBe(false);
  });

  it('adds months across year ends both ways', () => {
    expect(addMonths('2025-11', 3)).toBe('2026-02');
    expect(addMonths('2026-01', -1)).toBe('2025-12');
    expect(addMonths('2024-12', 23)).toBe('2026-11');
  });

  it('maps months to quarters and back', () => {
    expect(quarterOf('2026-03')).toBe('2026-Q1');
    expect(quarterOf('2026-10')).toBe('2026-Q4');
    expect(periodsOfQuarter('2026-Q2')).toEqual(['2026-04', '2026-05', '2026-06']);
    expect(() => periodsOfQuarter('2026-Q5')).toThrow(/YYYY-Qn/);
  });
});
