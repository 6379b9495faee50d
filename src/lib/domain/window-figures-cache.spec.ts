import { describe, expect, it } from 'vitest';
import type { Study } from './study';
import { WindowFiguresCache } from './window-figures-cache';

const study = (id: string, rev = 1) => ({ id, rev }) as Study;
const value = (months: number) => ({ result: undefined, months });

describe('window figures cache', () => {
  it('finds an entry only for the same characteristic revision, first month and studies with their revisions', () => {
    const cache = new WindowFiguresCache();
    const c = { id: 'c1', rev: 2 };
    cache.set(c, '2026-01', [study('a'), study('b')], value(2));
    expect(cache.get(c, '2026-01', [study('a'), study('b')])).toEqual(value(2));
    expect(cache.get({ id: 'c1', rev: 3 }, '2026-01', [study('a'), study('b')])).toBeUndefined();
    expect(cache.get(c, '2026-02', [study('a'), study('b')])).toBeUndefined();
    expect(cache.get(c, '2026-01', [study('a'), study('b', 2)])).toBeUndefined();
    expect(cache.get(c, '2026-01', [study('a')])).toBeUndefined();
    expect(cache.get({ id: 'c2', rev: 2 }, '2026-01', [study('a'), study('b')])).toBeUndefined();
  });

  it('keeps at most 24 windows per characteristic, dropping the oldest', () => {
    const cache = new WindowFiguresCache();
    const c = { id: 'c1', rev: 1 };
    for (let i = 0; i < 30; i += 1) cache.set(c, `w${i}`, [study(`s${i}`)], value(i));
    expect(cache.size).toBe(24);
    expect(cache.get(c, 'w0', [study('s0')])).toBeUndefined();
    expect(cache.get(c, 'w29', [study('s29')])).toEqual(value(29));
  });
});
