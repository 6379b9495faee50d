import { describe, expect, it } from 'vitest';
import { expectAbsolute } from '../../../tests/support/reference-data';
import { zChangeTest, zStandardError } from './z-change-test';

describe('change of z-level beyond noise', () => {
  it('measured data: hand-checked standard errors and Wald statistics', () => {
    // By hand: SE(3.0, n=50) = √(1/50 + 9/98) = √(0.02 + 0.0918367) = √0.1118367 = 0.334420.
    expectAbsolute(zStandardError({ z: 3, n: 50, kind: 'measured' }), 0.33442, 5e-6);
    // SE(3.6, n=50) = √(0.02 + 12.96/98) = √0.1522449 = 0.390186; together √0.2640816 = 0.513889;
    // W = 0.6 / 0.513889 = 1.16757 → two-sided p = 0.2430: within noise.
    const small = zChangeTest({ z: 3, n: 50, kind: 'measured' }, { z: 3.6, n: 50, kind: 'measured' });
    expectAbsolute(small.standardError, 0.513889, 5e-6);
    expectAbsolute(small.statistic, 1.16757, 5e-5);
    expectAbsolute(small.pValue, 0.243, 5e-4);
    expect(small.beyondNoise).toBe(false);
    // n = 500: SE² = 0.002 + 9/998 = 0.0110180 and 0.002 + 12.96/998 = 0.0149860; √0.0260040 = 0.161258;
    // W = 0.6 / 0.161258 = 3.72074 → p = 0.000199: more than noise.
    const large = zChangeTest({ z: 3, n: 500, kind: 'measured' }, { z: 3.6, n: 500, kind: 'measured' });
    expectAbsolute(large.statistic, 3.72074, 5e-5);
    expectAbsolute(large.pValue, 0.000199, 5e-6);
    expect(large.beyondNoise).toBe(true);
  });

  it('counted data: delta-method standard error, and no test for a bound', () => {
    // p = 0.01 of 2000 units: z = Q⁻¹(0.01) = 2.326348, φ(z) = 0.0266521; SE(p) = √(0.0099/2000) = 0.00222486;
    // SE(z) = 0.00222486 / 0.0266521 = 0.0834781.
    expectAbsolute(zStandardError({ z: 2.326348, n: 2000, kind: 'counted', p: 0.01 }), 0.0834781, 2e-6);
    const bound = zChangeTest(
      { z: 2.326348, n: 2000, kind: 'counted', p: 0.01 },
      { z: 3.5, n: 2000, kind: 'counted', p: 0 }
    );
    expect(bound.beyondNoise).toBeUndefined();
    expectAbsolute(bound.change, 1.173652, 1e-6);
  });
});
