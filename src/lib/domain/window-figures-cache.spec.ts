import { describe, expect, it } from 'vitest';
import type { Characteristic } from './characteristic';
import { judgeInput } from './portfolio-ranking';
import { WindowFiguresCache } from './window-figures-cache';

const characteristic = (rev: number) =>
  ({ id: 'c', rev, processId: 'p', name: 'c', unit: '', dataKind: 'measured' }) as unknown as Characteristic;
/** A window of `months` months (none with figures) under this key. */
const windowOf = (rev: number, first: number, end: number, rowStamp: number, months = 0) =>
  judgeInput(characteristic(rev), undefined, months, undefined, false, first, end, rowStamp);

describe('window figures cache', () => {
  it('finds a window only for the same model, row, revision, months and row stamp', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    const w = windowOf(2, 100, 102, 7);
    cache.set(model, 4, w);
    expect(cache.get(model, 4, 2, 100, 102, 7)).toBe(w);
    expect(cache.get(model, 4, 3, 100, 102, 7)).toBeUndefined();
    expect(cache.get(model, 4, 2, 101, 102, 7)).toBeUndefined();
    expect(cache.get(model, 4, 2, 100, 103, 7)).toBeUndefined();
    expect(cache.get(model, 4, 2, 100, 102, 8)).toBeUndefined();
    expect(cache.get(model, 5, 2, 100, 102, 7)).toBeUndefined();
    expect(cache.get({}, 4, 2, 100, 102, 7)).toBeUndefined();
  });

  it('never finds a window judged outside a cache (its key is NaN)', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    cache.set(model, 0, judgeInput(characteristic(1), undefined, 0));
    expect(cache.get(model, 0, 1, NaN, NaN, NaN)).toBeUndefined();
  });

  it('starts afresh when it is given another model', () => {
    const cache = new WindowFiguresCache();
    const before = {};
    cache.set(before, 0, windowOf(1, 100, 100, 1));
    const after = {};
    cache.set(after, 1, windowOf(1, 100, 100, 1));
    expect(cache.size).toBe(1);
    expect(cache.get(before, 0, 1, 100, 100, 1)).toBeUndefined();
  });

  it('keeps at most 24 windows per characteristic, dropping the oldest', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    for (let i = 0; i < 30; i += 1) cache.set(model, 0, windowOf(1, i, i + 2, 1, i));
    expect(cache.size).toBe(24);
    expect(cache.get(model, 0, 1, 0, 2, 1)).toBeUndefined();
    expect(cache.get(model, 0, 1, 29, 31, 1)?.months).toBe(29);
    expect(cache.get(model, 0, 1, 6, 8, 1)?.months).toBe(6);
  });

  it('puts a window judged again under the same key where the old one was', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    const old = windowOf(1, 100, 102, 5);
    cache.set(model, 0, windowOf(1, 90, 92, 5));
    cache.set(model, 0, old);
    const again = windowOf(1, 100, 102, 5, 3);
    cache.replace(0, old, again);
    expect(cache.get(model, 0, 1, 100, 102, 5)).toBe(again);
    expect(cache.size).toBe(2);
  });
});
