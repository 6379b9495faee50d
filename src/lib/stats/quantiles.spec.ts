import { describe, expect, it } from 'vitest';
import { checkValues, expectAbsolute, furnaceThickness } from '../../../tests/support/reference-data';
import { fiveNumbers, median } from './quantiles';

describe('fiveNumbers', () => {
  it('reproduces the furnace case study quantile table (NIST/SEMATECH e-Handbook §3.5.1.2: 0, 25, 50, 75, 100 %)', () => {
    const pub = checkValues().furnace_case_study.published.quantiles as Record<string, number>;
    const f = fiveNumbers(furnaceThickness())!;
    // Printed to two decimals in the handbook.
    expectAbsolute(f.lowest, pub['0']!, 0.006, 'minimum');
    expectAbsolute(f.lowerQuartile, pub['25']!, 0.006, 'lower quartile');
    expectAbsolute(f.median, pub['50']!, 0.006, 'median');
    expectAbsolute(f.upperQuartile, pub['75']!, 0.006, 'upper quartile');
    expectAbsolute(f.highest, pub['100']!, 0.006, 'maximum');
  });

  it('p(n+1) quartiles worked by hand (Hyndman & Fan 1996, type 6), in any order of the values', () => {
    // 1…9 unordered: h = 0.25 × 10 = 2.5 → 2 + 0.5 × (3 − 2); h = 7.5 → 7.5.
    expect(fiveNumbers([9, 1, 8, 2, 7, 3, 6, 4, 5])).toEqual({
      lowest: 1,
      lowerQuartile: 2.5,
      median: 5,
      upperQuartile: 7.5,
      highest: 9
    });
    // Two values: at the quartiles h = 0.75 and 2.25 fall outside the rule's range, so they are clamped to the ends.
    expect(fiveNumbers([4, 2])).toEqual({
      lowest: 2,
      lowerQuartile: 2,
      median: 3,
      upperQuartile: 4,
      highest: 4
    });
    expect(fiveNumbers([])).toBeUndefined();
  });

  it('gives the median as median() does, for odd and even counts', () => {
    for (const values of [
      [3, 1, 2],
      [4, 1, 3, 2],
      [0.5, -1.25, 7, 2.5, 3.75, 1]
    ]) {
      expect(fiveNumbers(values)!.median).toBe(median(values));
    }
  });
});
