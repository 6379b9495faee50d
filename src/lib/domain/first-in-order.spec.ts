import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { firstInOrder } from './first-in-order';

describe('first in order', () => {
  it('equals filter, stable sort and slice (property; ties and kept items included)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ key: fc.integer({ min: -5, max: 5 }), tag: fc.nat(1000) }), { maxLength: 300 }),
        fc.integer({ min: -1, max: 60 }),
        fc.boolean(),
        (items, count, filtered) => {
          const compare = (a: { key: number }, b: { key: number }) => a.key - b.key;
          const keep = filtered ? (x: { tag: number }) => x.tag % 3 !== 0 : () => true;
          const expected = items.filter(keep).sort(compare).slice(0, Math.max(0, count));
          const got = firstInOrder(items, count, compare, keep);
          // The same items, in the same order (identity: equal keys keep the order of the input).
          expect(got.length).toBe(expected.length);
          got.forEach((item, i) => expect(item).toBe(expected[i]));
        }
      ),
      { numRuns: 500, seed: 41 }
    );
  });
});
