import fc from 'fast-check';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { checkValues, expectAbsolute, expectRelative } from '../../../tests/support/reference-data';
import {
  millsRatio,
  millsTerms,
  normalCdf,
  normalQuantile,
  normalSf,
  normalUpperQuantile
} from './normal-distribution';

describe('standard normal tails', () => {
  // Source: tests/fixtures/check-values.json sigma_level_table.computed_scipy (scipy.stats.norm.sf, scipy 1.17).
  const rows = checkValues().sigma_level_table.computed_scipy as {
    sigma_level: number;
    dpmo_no_shift_one_sided: number;
  }[];
  it.each(rows.map((r) => [r.sigma_level, r.dpmo_no_shift_one_sided]))(
    'Q(%s)·10⁶ matches scipy to 1e-13 relative',
    (z, dpmo) => {
      expectRelative(normalSf(z) * 1e6, dpmo, 1e-13);
    }
  );

  it('keeps its precision in the far tail (no 1 − Φ)', () => {
    // scipy.stats.norm.sf values, quoted from memory of the scipy output and consistent with A&S 26.2.12.
    expectRelative(normalSf(6), 9.865876450376946e-10, 1e-12, 'Q(6)');
    expectRelative(normalSf(8), 6.220960574271785e-16, 1e-12, 'Q(8)');
    expectRelative(normalCdf(-8), 6.220960574271785e-16, 1e-12, 'Φ(−8)');
    // The asymptotic bound φ(z)/z·(1 − 1/z²) < Q(z) < φ(z)/z (A&S 26.2.12) holds at z = 8.
    const phi = Math.exp(-32) / Math.sqrt(2 * Math.PI);
    expect(normalSf(8)).toBeLessThan(phi / 8);
    expect(normalSf(8)).toBeGreaterThan((phi / 8) * (1 - 1 / 64));
  });

  it('gives the coverage facts 68.27 % / 95.45 % / 99.73 % within ±1/2/3σ (common practice, 4 decimals)', () => {
    const within = (k: number) => 1 - 2 * normalSf(k);
    expectAbsolute(within(1) * 100, 68.27, 0.005);
    expectAbsolute(within(2) * 100, 95.45, 0.005);
    expectAbsolute(within(3) * 100, 99.73, 0.005);
  });

  it('agrees with jStat where jStat is itself precise (jStat.normal.cdf: |z| ≤ 3 to 1e-12, |z| ≤ 5 to 1e-9)', () => {
    for (let z = -3; z <= 3; z += 0.25)
      expectRelative(normalCdf(z), jStat.normal.cdf(z, 0, 1), 1e-12, `z=${z}`);
    for (let z = -5; z <= 5; z += 0.25)
      expectRelative(normalCdf(z), jStat.normal.cdf(z, 0, 1), 1e-9, `z=${z}`);
  });

  it('takes enough terms of the continued fraction: within 4e-16 of 5 000 terms over z ∈ [3, 38.5]', () => {
    // The fraction converges (A&S 26.2.14); 5 000 terms are far past the point where more change no digit here.
    let worst = 0;
    let worstZ = 3;
    for (let i = 0; i <= 14_200; i += 1) {
      const z = 3 + i * 2.5e-3;
      const error = Math.abs(millsRatio(z) / millsRatio(z, 5000) - 1);
      if (error > worst) [worst, worstZ] = [error, z];
    }
    expect(worst, `at z = ${worstZ}`).toBeLessThan(4e-16);
    // Fewer terms than millsTerms gives do not reach it where the fraction converges slowest.
    expect(Math.abs(millsRatio(3, millsTerms(3) - 30) / millsRatio(3, 5000) - 1)).toBeGreaterThan(4e-16);
  });

  it('is continuous where the series hands over to the continued fraction (z = 3)', () => {
    expectRelative(normalSf(3 - 1e-12), normalSf(3), 1e-10);
    expect(normalSf(3 - 1e-9)).toBeGreaterThan(normalSf(3));
  });
});

describe('standard normal quantiles', () => {
  it('matches published table values (NIST/SEMATECH e-Handbook §1.3.6.7.1 critical values, 3 decimals)', () => {
    expectAbsolute(normalQuantile(0.95), 1.645, 0.0005);
    expectAbsolute(normalQuantile(0.975), 1.96, 0.0005);
    expectAbsolute(normalQuantile(0.995), 2.576, 0.0005);
    expectAbsolute(normalQuantile(0.999), 3.09, 0.0005);
  });

  it('agrees with jStat.normal.inv (relative 1e-9)', () => {
    for (const p of [0.001, 0.01, 0.1, 0.3, 0.5, 0.7, 0.9, 0.99, 0.999]) {
      expectRelative(normalQuantile(p) + 10, jStat.normal.inv(p, 0, 1) + 10, 1e-9, `p=${p}`);
    }
  });

  it('inverts the upper tail from tiny fractions (sigma-level inverse checks, scipy)', () => {
    // Source: check-values.json sigma_level_table.inverse_check (scipy.stats.norm.isf + 1.5)
    expectRelative(normalUpperQuantile(3.4e-6) + 1.5, 5.9998544700250065, 1e-12);
    expectRelative(normalUpperQuantile(66807e-6) + 1.5, 3.000001553990341, 1e-12);
  });

  // Each round trip goes through the tail that is small, the only one a double can hold precisely there.
  it('round-trips z → tail → z out to 8σ (property, fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 8, noNaN: true }), (z) => {
        expect(Math.abs(normalUpperQuantile(normalSf(z)) - z)).toBeLessThan(1e-12 * Math.max(1, z));
        expect(Math.abs(normalQuantile(normalCdf(-z)) + z)).toBeLessThan(1e-12 * Math.max(1, z));
      }),
      { numRuns: 500 }
    );
  });

  it('refuses probabilities outside [0, 1]', () => {
    expect(() => normalQuantile(1.2)).toThrow(
      /A probability from 0 to 1 is needed for a normal quantile \(got 1.2\)/
    );
    expect(normalQuantile(0)).toBe(Number.NEGATIVE_INFINITY);
  });
});
