import { describe, expect, it } from 'vitest';
import { lazyValidation } from './record-validation';

describe('a record kind’s validation, loaded on first write', () => {
  it('is fetched once and then reused', async () => {
    let loads = 0;
    const load = lazyValidation(async () => {
      loads += 1;
      return { parse: (x: unknown) => x as { a: number }, fields: ['a'] };
    });
    const [a, b] = await Promise.all([load(), load()]);
    expect(a).toBe(b);
    expect((await load()).fields).toEqual(['a']);
    expect(loads).toBe(1);
  });

  it('says in words that nothing was saved when it cannot be fetched, and tries again next time', async () => {
    let attempts = 0;
    const load = lazyValidation(async () => {
      attempts += 1;
      if (attempts === 1) throw new TypeError('Failed to fetch dynamically imported module');
      return { parse: (x: unknown) => x, fields: [] };
    });
    await expect(load()).rejects.toThrow(/Nothing was saved: the checks for this record could not be loaded/);
    await expect(load()).resolves.toMatchObject({ fields: [] });
    expect(attempts).toBe(2);
  });
});
