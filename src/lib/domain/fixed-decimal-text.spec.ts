import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixedDecimalText } from './fixed-decimal-text';

// The reference is the platform's own Intl.NumberFormat (ECMA-402, ICU's en-US data), which this function
// stands in for: every case below is compared with it, none with a value written down here.
const intl = (v: number, decimals: number, grouping: boolean) =>
  new Intl.NumberFormat('en-US', {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
    useGrouping: grouping
  }).format(v);

const decimals = fc.integer({ min: 0, max: 9 });

describe('fixedDecimalText: en-US fixed decimals as Intl writes them', () => {
  it('agrees with Intl on any finite double, at any magnitude', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), decimals, fc.boolean(), (v, d, g) => {
        expect(fixedDecimalText(v, d, g)).toBe(intl(v, d, g));
      }),
      { numRuns: 20_000 }
    );
  });

  it('agrees with Intl on the magnitudes figures have', () => {
    const magnitude = fc
      .tuple(fc.double({ min: 1, max: 10, noNaN: true }), fc.integer({ min: -12, max: 12 }), fc.boolean())
      .map(([m, e, neg]) => (neg ? -1 : 1) * m * 10 ** e);
    fc.assert(
      fc.property(magnitude, decimals, fc.boolean(), (v, d, g) => {
        expect(fixedDecimalText(v, d, g)).toBe(intl(v, d, g));
      }),
      { numRuns: 20_000 }
    );
  });

  it('rounds the shortest decimal form half away from zero, as Intl does (ties, carries, signs)', () => {
    // Decimal ties such as 1.005 (binary value just below the tie, which toFixed rounds down), nines that
    // carry into a new digit, and negatives that round to zero.
    const tie = fc
      .tuple(fc.integer({ min: -10_000_000, max: 10_000_000 }), fc.integer({ min: 1, max: 8 }))
      .map(([k, e]) => (k * 10 + 5) / 10 ** e);
    const nines = fc.integer({ min: 1, max: 12 }).map((n) => Number('9'.repeat(n)) / 10 ** (n % 5));
    fc.assert(
      fc.property(
        fc.oneof(
          tie,
          nines,
          tie.map((x) => -x)
        ),
        decimals,
        fc.boolean(),
        (v, d, g) => {
          expect(fixedDecimalText(v, d, g)).toBe(intl(v, d, g));
        }
      ),
      { numRuns: 20_000 }
    );
    for (const v of [
      1.005, -1.005, 2.5, -2.5, 0.5, 0.05, 9.995, 999.5, -0, 0, -0.001, 5e-324, 1e21, 1.2345e-7
    ])
      for (const d of [0, 1, 2, 3, 6])
        for (const g of [false, true]) expect(fixedDecimalText(v, d, g)).toBe(intl(v, d, g));
  });
});
