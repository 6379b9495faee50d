import { describe, expect, it } from 'vitest';
import { isLive, stampDeleted, stampNew, stampRestored, stampUpdate, type WriteContext } from './record-meta';

function clockAt(...times: string[]): WriteContext {
  let i = 0;
  return {
    deviceId: 'dev-a',
    now: () => new Date(times[Math.min(i++, times.length - 1)] as string),
    newId: () => 'id-1'
  };
}

describe('record bookkeeping', () => {
  it('stamps a new record with revision 1 and the device', () => {
    const r = stampNew({ name: 'x' }, clockAt('2026-01-01T00:00:00Z'));
    expect(r).toEqual({
      name: 'x',
      id: 'id-1',
      createdAt: '2026-01-01T00:00:00.000Z',
      updatedAt: '2026-01-01T00:00:00.000Z',
      rev: 1,
      deviceId: 'dev-a'
    });
  });

  it('keeps id and creation time on update and counts the revision up', () => {
    const created = stampNew({ name: 'x' }, clockAt('2026-01-01T00:00:00Z'));
    const other: WriteContext = {
      deviceId: 'dev-b',
      now: () => new Date('2026-02-01T00:00:00Z'),
      newId: () => 'unused'
    };
    const updated = stampUpdate(created, { name: 'y' }, other);
    expect(updated).toMatchObject({
      id: 'id-1',
      createdAt: created.createdAt,
      rev: 2,
      deviceId: 'dev-b',
      name: 'y'
    });
  });

  it('leaves a tombstone that keeps the fields, and restores as a further revision', () => {
    const created = stampNew({ name: 'x' }, clockAt('2026-01-01T00:00:00Z'));
    const ctx = clockAt('2026-03-01T00:00:00Z');
    const gone = stampDeleted(created, ctx);
    expect(isLive(gone)).toBe(false);
    expect(gone).toMatchObject({ name: 'x', rev: 2, deletedAt: '2026-03-01T00:00:00.000Z' });
    const back = stampRestored(gone, ctx);
    expect(isLive(back)).toBe(true);
    expect(back.rev).toBe(3);
  });
});
