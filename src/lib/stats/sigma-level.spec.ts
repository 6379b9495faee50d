import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkValues, expectAbsolute, expectRelative } from '../../../tests/support/reference-data';
import { normalTailFractions } from './tail-fractions';
import {
  combinedYield,
  longTermZ,
  ppmFromZ,
  rolledThroughputYield,
  shortTermLevel,
  zFromPpm,
  zFromYield
} from './sigma-level';

describe('ppm ↔ z-level ↔ yield', () => {
  it('the sigma-level table in common use (common practice; 6w2h.org and micquality.com tables)', () => {
    // 3.4 ppm is 4.5 one-sided, reported as 6.0 with the 1.5 shift; 66 807 ppm is 1.5 → 3.0 with the shift.
    expectAbsolute(zFromPpm(3.4), 4.5, 5e-4);
    expectAbsolute(shortTermLevel(zFromPpm(3.4)), 6.0, 5e-4);
    expectAbsolute(shortTermLevel(zFromPpm(66807)), 3.0, 5e-5);
    const published = checkValues().sigma_level_table.published_secondary[
      "6w2h.org 2011 'Sigma Performance Levels' (http://www.6w2h.org/2011/09/sigma-performance-levels-one-to-six.html)"
    ] as Record<string, number>;
    for (const [level, dpmo] of Object.entries(published)) {
      // The published table rounds (690 000 for 691 462 at level 1): compare to its own precision.
      const computed = ppmFromZ(longTermZ(Number(level)));
      expect(Math.abs(computed - dpmo) / dpmo, `level ${level}`).toBeLessThan(0.003);
    }
  });

  it('matches scipy for the shifted one-sided and two-sided centred forms (check-values.json, 1e-12)', () => {
    const rows = checkValues().sigma_level_table.computed_scipy as {
      sigma_level: number;
      dpmo_shift1_5_one_sided?: number;
      ['dpmo_shift1.5_one_sided']: number;
      dpmo_no_shift_two_sided_centered: number;
    }[];
    for (const r of rows) {
      expectRelative(
        ppmFromZ(r.sigma_level - 1.5),
        r['dpmo_shift1.5_one_sided'],
        1e-12,
        `shifted ${r.sigma_level}`
      );
      const centred = normalTailFractions(0, 1, { lsl: -r.sigma_level, usl: r.sigma_level });
      expectRelative(
        centred.total * 1e6,
        r.dpmo_no_shift_two_sided_centered,
        1e-12,
        `two-sided ${r.sigma_level}`
      );
    }
  });

  it('limits at ±1σ: zMin 1, yield 68.27 %, zLevel ≈ 0.475 — different numbers, never mixed', () => {
    const t = normalTailFractions(0, 1, { lsl: -1, usl: 1 });
    expect(t.zMin).toBe(1);
    expectAbsolute((1 - t.total) * 100, 68.27, 0.005);
    expectAbsolute(t.zLevel, 0.4753, 5e-4);
  });

  it('round-trips ppm → z → ppm and yield → z (property, fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 999_999, noNaN: true }), (ppm) => {
        expectRelative(ppmFromZ(zFromPpm(ppm)), ppm, 1e-9);
        // A yield like 1 − 10⁻¹² cannot hold its tail in a double; the yield form is checked from 1 ppm up.
        if (ppm >= 1) expectRelative(zFromYield(1 - ppm / 1e6), zFromPpm(ppm), 1e-8);
      }),
      { numRuns: 300 }
    );
  });

  it('combines yields by product (independence) and refuses out-of-range input', () => {
    expectRelative(combinedYield([0.99, 0.98, 0.97]), 0.941094, 1e-12);
    expectRelative(rolledThroughputYield([0.9, 0.9]), 0.81, 1e-12);
    expect(() => zFromPpm(-1)).toThrow(/between 0 and 1 000 000/);
    expect(() => zFromYield(1.5)).toThrow(/between 0 and 1/);
  });
});
