import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sortById } from './id-order';
import { compareById } from './record-meta';

/** Ids as records carry them, and the awkward ones: short, sharing long prefixes, upper case, other characters. */
const idCharacters = fc.constantFrom(...'-0123456789ABCDEFabcdef'.split(''));
const shortId = fc.array(idCharacters, { maxLength: 9 }).map((cs) => cs.join(''));
const sharedPrefix = fc
  .tuple(fc.constantFrom('abcdef', 'abcde', '000000', 'ffffff-'), shortId)
  .map(([p, rest]) => p + rest);
const alphabetId = fc.oneof(
  { weight: 4, arbitrary: fc.uuid() },
  { weight: 3, arbitrary: shortId },
  { weight: 2, arbitrary: sharedPrefix }
);
/** Now and then an id of other characters: the whole list is then sorted by compareById. */
const anyId = fc.oneof(
  { weight: 20, arbitrary: alphabetId },
  { weight: 1, arbitrary: fc.string({ maxLength: 8 }) }
);

/** Records of one id alphabet or the other; repeated ids tell whether equal ids keep their order. */
const records = fc
  .oneof(
    { weight: 3, arbitrary: fc.array(alphabetId, { minLength: 0, maxLength: 400, size: 'max' }) },
    { weight: 1, arbitrary: fc.array(anyId, { minLength: 0, maxLength: 400, size: 'max' }) }
  )
  .chain((ids) => fc.subarray(ids).map((again) => [...ids, ...again]))
  .map((ids) => ids.map((id, at) => ({ id, at })));

describe('sortById', () => {
  it('gives the order (and, for equal ids, the stable order) of a sort by compareById', () => {
    fc.assert(
      fc.property(records, (list) => {
        const expected = [...list].sort(compareById);
        const sorted = sortById([...list]);
        expect(sorted.map((r) => r.at)).toEqual(expected.map((r) => r.at));
      }),
      { numRuns: 600 }
    );
  });

  it('sorts UUIDs of a company-size list as compareById does, in place', () => {
    const ids = Array.from({ length: 50_000 }, (_, i) => ({ id: crypto.randomUUID() as string, at: i }));
    // A few sharing their first six characters with another, so that runs are fixed by the whole id.
    for (let i = 0; i < 200; i += 1)
      ids.push({ id: `${ids[i]!.id.slice(0, 6)}${crypto.randomUUID().slice(6)}`, at: 50_000 + i });
    const expected = [...ids].sort(compareById).map((r) => r.at);
    const list = [...ids];
    expect(sortById(list)).toBe(list);
    expect(list.map((r) => r.at)).toEqual(expected);
  });
});
