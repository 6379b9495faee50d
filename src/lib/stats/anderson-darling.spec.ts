import { describe, expect, it } from 'vitest';
import {
  checkValues,
  expectAbsolute,
  expectRelative,
  furnaceThickness,
  nistCertified,
  nistValues
} from '../../../tests/support/reference-data';
import { andersonDarlingNormal, andersonDarlingNormalP } from './anderson-darling';
import { mean, sampleSd } from './moments';
import { sortedCopy } from './quantiles';
import { analyzeMeasured } from './analyze-measured';
import { SeededRandom } from '../../../seed-data/seeded-random';

const ad = checkValues().anderson_darling;

function test(values: number[]) {
  return andersonDarlingNormal(sortedCopy(values), mean(values), sampleSd(values));
}

describe('Anderson–Darling normality test', () => {
  it('reproduces the NAG g08ckc worked example (A² 0.165956, A²* 0.171296, p 0.931155; 6 decimals)', () => {
    const ex = ad.published_worked_example;
    const r = test(ex.data);
    expectAbsolute(r.ad, ex.A2, 5e-7);
    expectAbsolute(r.adAdjusted, ex.A2_star, 5e-7);
    expectAbsolute(r.p, ex.upper_tail_p, 5e-7);
  });

  it('matches scipy.stats.anderson on the furnace data, with the D’Agostino–Stephens p-value', () => {
    const r = test(furnaceThickness());
    expectRelative(r.ad, ad.furnace.A2_scipy, 1e-10);
    expectRelative(r.adAdjusted, ad.furnace.A2_star, 1e-10);
    expectRelative(r.p, ad.furnace.p_DAgostinoStephens, 1e-10);
  });

  it.each(['Lottery', 'Lew', 'Michelso', 'PiDigits'])('matches scipy on NIST StRD %s', (name) => {
    const ref = nistCertified()[name]!.anderson_darling_normal_computed_scipy_1_17!;
    const r = test(nistValues(name));
    expectRelative(r.ad, ref.A2, 1e-9);
    // Beyond the formula's fitted range (A²* ≥ 10) p is reported as 0; the reference applied the formula there.
    if (ref.p_DAgostino_Stephens < 1e-20) expect(r.p).toBe(0);
    else expectRelative(r.p, ref.p_DAgostino_Stephens, 1e-6);
  });

  it('uses each branch of Table 4.9 and stays within [0, 1]', () => {
    expect(andersonDarlingNormalP(0.1)).toBeGreaterThan(0.9);
    expect(andersonDarlingNormalP(0.3)).toBeGreaterThan(andersonDarlingNormalP(0.5));
    expectAbsolute(andersonDarlingNormalP(0.752), 0.05, 0.002); // the tabled 5 % point
    expect(andersonDarlingNormalP(50)).toBeGreaterThanOrEqual(0);
  });

  it('never climbs back towards 1: non-increasing over A²* from 0 to 10⁶, and 0 far beyond the fitted range', () => {
    let previous = 1;
    for (let a = 0; a <= 1e6; a = a < 20 ? a + 0.01 : a * 1.05) {
      const p = andersonDarlingNormalP(a);
      expect(p).toBeLessThanOrEqual(previous + 1e-15);
      expect(p).toBeGreaterThanOrEqual(0);
      previous = p;
    }
    // The case of the trust issue: A² = 450 gave p = 1 through the quadratic term of the last piece.
    expect(andersonDarlingNormalP(450)).toBe(0);
    expect(andersonDarlingNormalP(9.99)).toBeLessThan(1e-20);
  });

  it('agrees with an independent Monte Carlo null distribution of A²* (n = 40, 20 000 normal samples)', () => {
    // Independent implementation: simulate the statistic under normality with estimated mean and sd and count
    // exceedances. The Table 4.9 formula is itself a fit, so the tolerance is the Monte Carlo error (SE ≤ 0.0036)
    // plus 0.01 for the fit.
    const rng = new SeededRandom(20261202);
    const n = 40;
    const runs = 20_000;
    const stats = new Float64Array(runs);
    const sample = new Array<number>(n);
    for (let r = 0; r < runs; r++) {
      for (let i = 0; i < n; i++) sample[i] = rng.normal();
      stats[r] = test(sample).adAdjusted;
    }
    for (const a of [0.15, 0.25, 0.4, 0.55, 0.752, 1.0, 1.3]) {
      let above = 0;
      for (const s of stats) if (s > a) above += 1;
      expectAbsolute(andersonDarlingNormalP(a), above / runs, 0.02);
    }
  });

  it('judges 10 000 exponential values non-normal, so the model search runs and the ppm follows the skew', () => {
    const rng = new SeededRandom(7);
    const values = Array.from({ length: 10_000 }, () => -Math.log(1 - rng.next()));
    const r = test(values);
    expect(r.ad).toBeGreaterThan(100);
    expect(r.p).toBe(0);
    // Exponential with rate 1: P(X > 6) = e^-6 = 2 479 ppm exactly; the normal model would give far fewer.
    const figures = analyzeMeasured(values, { spec: { usl: 6 } });
    expect(figures.model).not.toBe('normal');
    expectRelative(figures.ppmTotal!, Math.exp(-6) * 1e6, 0.25);
  });
});
