import 'fake-indexeddb/auto';
import { Dexie } from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import { seqOf, shelvedStudy } from '../../../tests/support/shelved-study';
import { CapstanDatabase } from './database';
import {
  allStudies,
  countShelves,
  findStudy,
  putStudies,
  studiesChangedSince,
  studiesOf,
  studiesUnder,
  unsentStudies
} from './study-shelves';

const study = shelvedStudy;
const seq = seqOf;

let db: CapstanDatabase | undefined;
afterEach(async () => {
  db?.close();
  if (db) await Dexie.delete(db.name);
  db = undefined;
});

describe('studies on shelves', () => {
  it('puts each study in place of the one with its id, stamping only those written', async () => {
    db = new CapstanDatabase(`shelves-${Math.random()}`);
    await db.open();
    await putStudies(db, [
      study('a', 'c1', '2026-01'),
      study('b', 'c1', '2026-02'),
      study('x', 'c2', '2026-01')
    ]);
    const first = await studiesOf(db, 'c1');
    const since = Math.max(...first.map((s) => seq(s)!));
    // A new version of 'a' carries the sequence of the one it replaces: it must get a fresh one.
    await putStudies(db, [{ ...first[0]!, rev: 2, data: { kind: 'summary', n: 30, mean: 2, sd: 0.1 } }]);
    const after = await studiesOf(db, 'c1');
    expect(after.map((s) => [s.id, s.rev])).toEqual([
      ['a', 2],
      ['b', 1]
    ]);
    expect(seq(after[0])).toBeGreaterThan(since);
    expect(seq(after[1])).toBe(seq(first[1]));
    expect((await studiesChangedSince(db, since)).map((s) => s.id)).toEqual(['a']);
    expect(await unsentStudies(db, since)).toEqual({ count: 1, oldest: seq(after[0]), atLeast: false });
    expect(await allStudies(db)).toHaveLength(3);
    expect(await countShelves(db)).toBe(2);
    expect((await studiesUnder(db, ['c2', 'c9', 'c1'])).map((s) => s.id)).toEqual(['x', 'a', 'b']);
    expect((await findStudy(db, 'x'))?.characteristicId).toBe('c2');
    expect(await findStudy(db, 'x', 'c1')).toBeUndefined();
  });

  it('counts the studies written since a point one by one on a few shelves; on many, one a shelf at least', async () => {
    db = new CapstanDatabase(`shelves-${Math.random()}`);
    await db.open();
    const months = ['2026-01', '2026-02', '2026-03'];
    const shelves = (n: number) =>
      Array.from({ length: n }, (_, c) => months.map((m) => study(`s${c}-${m}`, `c${c}`, m))).flat();
    await putStudies(db, shelves(120));
    const point = db.sequence.latest;
    // One month more on each of 3 shelves, two of them on the first: counted one by one.
    await putStudies(
      db,
      [0, 1, 2].map((c) => study(`s${c}-2026-04`, `c${c}`, '2026-04'))
    );
    await putStudies(db, [study('s0-2026-05', 'c0', '2026-05')]);
    const few = await unsentStudies(db, point);
    expect(few).toMatchObject({ count: 4, atLeast: false });
    // On 101 shelves: one a shelf at least, and the oldest is that of the shelf written least recently.
    await putStudies(
      db,
      Array.from({ length: 98 }, (_, c) => study(`s${c + 3}-2026-04`, `c${c + 3}`, '2026-04'))
    );
    const many = await unsentStudies(db, point);
    expect(many).toMatchObject({ count: 101, atLeast: true });
    expect(many.oldest).toBe(few.oldest);
    expect(await countShelves(db)).toBe(120);
  });
});
