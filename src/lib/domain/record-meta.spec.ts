import { describe, expect, it } from 'vitest';
import {
  clockOf,
  isLive,
  stampDeleted,
  stampNew,
  stampRestored,
  stampUpdate,
  versionOf,
  type WriteContext
} from './record-meta';

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
      deviceId: 'dev-a',
      vv: { 'dev-a': 1 },
      clock: '1767225600000-0000-dev-a'
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
      name: 'y',
      vv: { 'dev-a': 1, 'dev-b': 1 }
    });
  });

  it('stamps an edit later than the edited version even when this device clock is (a few hours) behind', () => {
    const created = stampNew({ name: 'x' }, clockAt('2026-06-01T00:00:00Z'));
    const behind = stampUpdate(
      created,
      { name: 'y' },
      { ...clockAt('2026-05-31T20:00:00Z'), deviceId: 'dev-b' }
    );
    expect(behind.clock! > created.clock!).toBe(true);
    expect(behind.clock).toBe('1780272000000-0001-dev-b');
  });

  it('never follows a stamp beyond its own time plus the tolerance: a version from the year 2286 cannot pin an edit', () => {
    const poisoned = {
      ...stampNew({ name: 'x' }, clockAt('2026-06-01T00:00:00Z')),
      clock: '9999999999999-9999-dev-a'
    };
    const edit = stampUpdate(
      poisoned,
      { name: 'y' },
      { ...clockAt('2026-06-02T00:00:00Z'), deviceId: 'dev-b' }
    );
    expect(edit.clock).toBe(`${Date.parse('2026-06-02T00:00:00Z')}-0000-dev-b`);
    expect(edit.clock).toMatch(/^\d{13}-\d{4}-dev-b$/);
  });

  it('reads the version of a record written before vectors existed from its rev and writer', () => {
    const old = {
      id: 'a',
      createdAt: '2026-01-01T00:00:00Z',
      updatedAt: '2026-01-02T00:00:00Z',
      rev: 3,
      deviceId: 'd'
    };
    expect(versionOf(old)).toEqual({ d: 3 });
    expect(clockOf(old)).toBe('1767312000000-0000-d');
    expect(stampUpdate(old, {}, clockAt('2026-02-01T00:00:00Z'))).toMatchObject({
      rev: 4,
      vv: { d: 3, 'dev-a': 1 }
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
