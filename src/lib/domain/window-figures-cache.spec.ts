import { describe, expect, it } from 'vitest';
import { WindowFiguresCache } from './window-figures-cache';

const value = (months: number) => ({ result: undefined, months });

describe('window figures cache', () => {
  it('finds an entry only for the same characteristic revision, first month and cell stamps', () => {
    const cache = new WindowFiguresCache();
    const c = { id: 'c1', rev: 2 };
    cache.set(c, '2026-01', [1, 2], value(2));
    expect(cache.get(c, '2026-01', [1, 2])).toMatchObject(value(2));
    expect(cache.get({ id: 'c1', rev: 3 }, '2026-01', [1, 2])).toBeUndefined();
    expect(cache.get(c, '2026-02', [1, 2])).toBeUndefined();
    expect(cache.get(c, '2026-01', [1, 3])).toBeUndefined();
    expect(cache.get(c, '2026-01', [1])).toBeUndefined();
    expect(cache.get({ id: 'c2', rev: 2 }, '2026-01', [1, 2])).toBeUndefined();
  });

  it('keeps at most 24 windows per characteristic, dropping the oldest', () => {
    const cache = new WindowFiguresCache();
    const c = { id: 'c1', rev: 1 };
    for (let i = 0; i < 30; i += 1) cache.set(c, `w${i}`, [i], value(i));
    expect(cache.size).toBe(24);
    expect(cache.get(c, 'w0', [0])).toBeUndefined();
    expect(cache.get(c, 'w29', [29])).toMatchObject(value(29));
  });
});
