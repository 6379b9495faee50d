import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { expectRelative } from '../../../tests/support/reference-data';
import { gammaQuantile, regularizedGamma } from './incomplete-gamma';
import { normalCdf } from './normal-distribution';

describe('regularised incomplete gamma', () => {
  it('agrees with jStat.lowRegGamma for moderate shapes (1e-10 relative)', () => {
    for (const a of [0.5, 1, 2.5, 10, 60]) {
      for (const x of [0.1, 0.5, 1, 3, 10, 40, 80]) {
        expectRelative(regularizedGamma(a, x).p, jStat.lowRegGamma(a, x), 1e-10, `a=${a} x=${x}`);
      }
    }
  });

  it('has closed forms to check against: P(1, x) = 1 − e^(−x), Q(1/2, x) = erfc(√x) = 2·Q_normal(√(2x))', () => {
    for (const x of [0.01, 1, 5, 30]) {
      expectRelative(regularizedGamma(1, x).q, Math.exp(-x), 1e-13, `x=${x}`);
      expectRelative(regularizedGamma(0.5, x).q, 2 * normalCdf(-Math.sqrt(2 * x)), 1e-12, `x=${x}`);
    }
  });

  it('stays fast and sensible for the huge shapes of a tight process (a = 10⁷)', () => {
    const a = 1e7;
    const t0 = performance.now();
    const mid = regularizedGamma(a, a);
    // For large a the gamma is nearly normal with mean a and sd √a: P(a, a) → ½ (A&S 6.5.33 limit).
    expect(Math.abs(mid.p - 0.5)).toBeLessThan(1e-3);
    expectRelative(regularizedGamma(a, a + 3 * Math.sqrt(a)).q, normalCdf(-3), 0.02);
    expect(performance.now() - t0).toBeLessThan(2000);
  });

  it('inverts itself: gammaQuantile(P(a, x)) = x', () => {
    for (const a of [0.7, 3, 40, 5e5]) {
      for (const p of [1e-6, 0.00135, 0.3, 0.5, 0.99865]) {
        const x = gammaQuantile(p, a, 2);
        const back = p < 0.5 ? regularizedGamma(a, x / 2).p : 1 - regularizedGamma(a, x / 2).q;
        expectRelative(back, p, 1e-9, `a=${a} p=${p}`);
      }
    }
  });
});

describe('chi-square quantiles through the incomplete gamma', () => {
  it('agree with jStat.chisquare.inv where jStat is quick (df ≤ 200, 1e-9 relative)', async () => {
    const { chiSquareQuantile } = await import('./confidence-bounds');
    for (const df of [1, 2, 5, 29, 167, 200]) {
      for (const p of [0.005, 0.025, 0.05, 0.5, 0.95, 0.975]) {
        expectRelative(chiSquareQuantile(p, df), jStat.chisquare.inv(p, df), 1e-9, `df=${df} p=${p}`);
      }
    }
  });
});
