import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from './canonical-json';
import { formatStamp, HybridClock, nextStamp, parseStamp } from './hybrid-clock';
import { mergeRecord, settleConflict } from './record-merge';
import { stampDeleted, stampNew, stampUpdate, type RecordMeta, type WriteContext } from './record-meta';
import { bumpVersion, compareVersions, joinVersions } from './version-vector';

type Named = RecordMeta & { name: string };

const device = (deviceId: string, iso: string): WriteContext => ({
  deviceId,
  now: () => new Date(iso),
  newId: () => '00000000-0000-4000-8000-000000000001'
});

describe('version vectors (Parker et al. 1983)', () => {
  it('orders descendants and detects concurrent writes', () => {
    expect(compareVersions({ a: 1 }, { a: 1 })).toBe('equal');
    expect(compareVersions({ a: 1 }, { a: 2 })).toBe('before');
    expect(compareVersions({ a: 2, b: 1 }, { a: 2 })).toBe('after');
    expect(compareVersions({ a: 2 }, { a: 1, b: 1 })).toBe('concurrent');
    expect(joinVersions({ b: 1, a: 3 }, { a: 2, c: 4 })).toEqual({ a: 3, b: 1, c: 4 });
    expect(bumpVersion({ a: 1 }, 'b')).toEqual({ a: 1, b: 1 });
  });

  it('join is the least upper bound: both operands are before or equal to it (property)', () => {
    const vv = fc.dictionary(fc.constantFrom('a', 'b', 'c'), fc.integer({ min: 1, max: 5 }));
    fc.assert(
      fc.property(vv, vv, (x, y) => {
        const j = joinVersions(x, y);
        expect(['before', 'equal']).toContain(compareVersions(x, j));
        expect(['before', 'equal']).toContain(compareVersions(y, j));
        expect(joinVersions(x, y)).toEqual(joinVersions(y, x));
      }),
      { numRuns: 300 }
    );
  });
});

describe('hybrid logical clock (Kulkarni et al. 2014)', () => {
  it('follows the wall clock and advances the counter when the wall clock stalls or runs back', () => {
    let now = 1000;
    const clock = new HybridClock('d', () => now);
    expect(clock.tick()).toBe('0000000001000-0000-d');
    expect(clock.tick()).toBe('0000000001000-0001-d');
    now = 500; // clock set back
    expect(clock.tick()).toBe('0000000001000-0002-d');
    clock.observe('0000000009000-0004-e'); // a stamp from a device whose clock is ahead
    expect(clock.tick()).toBe('0000000009000-0005-d');
    now = 10_000;
    expect(clock.tick()).toBe('0000000010000-0000-d');
  });

  it('string order is time order, then counter, then device (property)', () => {
    const parts = fc.record({
      wallMs: fc.integer({ min: 0, max: 4_000_000_000_000 }),
      counter: fc.integer({ min: 0, max: 9999 }),
      deviceId: fc.constantFrom('a', 'b')
    });
    fc.assert(
      fc.property(parts, parts, (x, y) => {
        const byParts = x.wallMs - y.wallMs || x.counter - y.counter || x.deviceId.localeCompare(y.deviceId);
        const byText = formatStamp(x) < formatStamp(y) ? -1 : formatStamp(x) > formatStamp(y) ? 1 : 0;
        expect(Math.sign(byParts)).toBe(byText);
        expect(parseStamp(formatStamp(x))).toEqual(x);
      }),
      { numRuns: 300 }
    );
  });

  it('rolls the wall time on when the counter is used up', () => {
    expect(nextStamp('0000000001000-9999-d', 0, 'd')).toBe('0000000001001-0000-d');
  });
});

describe('merging one record', () => {
  const base = stampNew({ name: 'Press line' }, device('site', '2026-01-01T00:00:00Z')) as Named;

  it('takes a descendant, ignores an ancestor, and changes nothing on a repeat', () => {
    const edited = stampUpdate(base, { name: 'Press line 2' }, device('hq', '2026-02-01T00:00:00Z'));
    expect(mergeRecord(undefined, base).kind).toBe('new');
    expect(mergeRecord(base, edited)).toMatchObject({ kind: 'updated', write: { name: 'Press line 2' } });
    expect(mergeRecord(edited, base).kind).toBe('unchanged');
    expect(mergeRecord(edited, edited).kind).toBe('unchanged');
  });

  it('reports edits on both sides as a conflict with the differing fields', () => {
    const here = stampUpdate(base, { name: 'A' }, device('site', '2026-02-01T00:00:00Z'));
    const there = stampUpdate(base, { name: 'B' }, device('hq', '2026-03-01T00:00:00Z'));
    const d = mergeRecord(here, there);
    expect(d).toMatchObject({ kind: 'conflict', nature: 'both-edited', fields: ['name'] });
    expect(d.write).toBeUndefined();
    const settled = settleConflict(d, 'newer');
    expect(settled.name).toBe('B');
    // The settled version has seen both, so it replaces either side without a further conflict.
    expect(mergeRecord(here, settled).kind).toBe('updated');
    expect(mergeRecord(there, settled).kind).toBe('updated');
    expect(canonicalJson(settleConflict(mergeRecord(there, here), 'newer'))).toBe(canonicalJson(settled));
  });

  it('treats a deletion against an edit as a conflict, both ways round', () => {
    const deleted = stampDeleted(base, device('hq', '2026-02-01T00:00:00Z'));
    const edited = stampUpdate(base, { name: 'A' }, device('site', '2026-02-02T00:00:00Z'));
    expect(mergeRecord(edited, deleted)).toMatchObject({ kind: 'conflict', nature: 'deleted-there' });
    expect(mergeRecord(deleted, edited)).toMatchObject({ kind: 'conflict', nature: 'deleted-here' });
    // A deletion of the version this side holds is simply a deletion.
    expect(mergeRecord(base, deleted).kind).toBe('deleted');
    // Two deletions agree.
    const deletedToo = stampDeleted(base, device('site', '2026-02-03T00:00:00Z'));
    expect(mergeRecord(deleted, deletedToo).kind).toBe('updated');
  });

  it('combines the versions when both sides made the same change', () => {
    const here = stampUpdate(base, { name: 'Same' }, device('site', '2026-02-01T00:00:00Z'));
    const there = stampUpdate(base, { name: 'Same' }, device('hq', '2026-02-01T00:00:00Z'));
    const d = mergeRecord(here, there);
    expect(d.kind).toBe('updated');
    expect(d.write?.vv).toEqual({ hq: 1, site: 2 });
    expect(mergeRecord(d.write, there).kind).toBe('unchanged');
  });

  it('flags the same vector with different content (two different settlements)', () => {
    const here = stampUpdate(base, { name: 'A' }, device('site', '2026-02-01T00:00:00Z'));
    const there = stampUpdate(base, { name: 'B' }, device('hq', '2026-03-01T00:00:00Z'));
    const d = mergeRecord(here, there);
    const a = settleConflict(d, 'local');
    const b = settleConflict(d, 'incoming');
    expect(mergeRecord(a, b)).toMatchObject({ kind: 'conflict', nature: 'diverged' });
  });
});

describe('same content', () => {
  it('agrees with comparing canonical text, bookkeeping left out (property)', async () => {
    const { contentOf, sameContent } = await import('./record-merge');
    const value = fc.oneof(
      fc.integer(),
      fc.double({ noNaN: true, noDefaultInfinity: true }),
      fc.string(),
      fc.constant(undefined)
    );
    const record = fc.record({
      name: fc.constantFrom('a', 'b'),
      extra: value,
      data: fc.record({ values: fc.array(fc.integer({ min: 0, max: 3 }), { maxLength: 3 }), note: value }),
      rev: fc.integer({ min: 1, max: 3 }),
      deletedAt: fc.constantFrom(undefined, '2026-01-01T00:00:00Z')
    });
    fc.assert(
      fc.property(record, record, (a, b) => {
        const x = { ...a, id: 'x', createdAt: '', updatedAt: '', deviceId: 'd' } as RecordMeta;
        const y = { ...b, id: 'x', createdAt: '', updatedAt: '', deviceId: 'e' } as RecordMeta;
        const byText =
          contentOf(x) === contentOf(y) && (x.deletedAt === undefined) === (y.deletedAt === undefined);
        expect(sameContent(x, y)).toBe(byText);
        expect(sameContent(x, { ...x, rev: 9 })).toBe(true);
      }),
      { numRuns: 500 }
    );
  });
});
