import { describe, expect, it } from 'vitest';
import { WindowFiguresCache } from './window-figures-cache';

const value = (months: number) => ({ result: undefined, months });

describe('window figures cache', () => {
  it('finds an entry only for the same model, row, revision, first month and cell stamps', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    const c = { rev: 2 };
    cache.set(model, 4, c, 100, [1, 2], value(2));
    expect(cache.get(model, 4, c, 100, [1, 2])).toMatchObject(value(2));
    expect(cache.get(model, 4, { rev: 3 }, 100, [1, 2])).toBeUndefined();
    expect(cache.get(model, 4, c, 101, [1, 2])).toBeUndefined();
    expect(cache.get(model, 4, c, 100, [1, 3])).toBeUndefined();
    expect(cache.get(model, 4, c, 100, [1])).toBeUndefined();
    expect(cache.get(model, 5, c, 100, [1, 2])).toBeUndefined();
    expect(cache.get({}, 4, c, 100, [1, 2])).toBeUndefined();
  });

  it('starts afresh when it is given another model', () => {
    const cache = new WindowFiguresCache();
    const before = {};
    cache.set(before, 0, { rev: 1 }, 100, [1], value(1));
    const after = {};
    cache.set(after, 1, { rev: 1 }, 100, [1], value(1));
    expect(cache.size).toBe(1);
    expect(cache.get(before, 0, { rev: 1 }, 100, [1])).toBeUndefined();
  });

  it('keeps at most 24 windows per characteristic, dropping the oldest', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    const c = { rev: 1 };
    for (let i = 0; i < 30; i += 1) cache.set(model, 0, c, i, [i], value(i));
    expect(cache.size).toBe(24);
    expect(cache.get(model, 0, c, 0, [0])).toBeUndefined();
    expect(cache.get(model, 0, c, 29, [29])).toMatchObject(value(29));
  });
});
