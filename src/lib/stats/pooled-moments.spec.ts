/**
 * The moments of merged samples. References: the definitions themselves — the mean and the n − 1 sample variance
 * of the concatenated values (computed here value by value), and the pooled standard deviation of one-way
 * analysis of variance, √(Σ(nᵢ − 1)sᵢ² / Σ(nᵢ − 1)) (any statistics text; e.g. Montgomery, "Design and Analysis
 * of Experiments", the error mean square of the one-way model).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MomentsFold, poolMoments, pooledWithinSd, summariseMoments, type Moments } from './pooled-moments';

describe('poolMoments', () => {
  it('gives the mean and sd of the concatenated values (1–4 with 5–9: mean 5, variance 7.5)', () => {
    const pooled = poolMoments(summariseMoments([1, 2, 3, 4]), summariseMoments([5, 6, 7, 8, 9]));
    expect(pooled.n).toBe(9);
    expect(pooled.mean).toBeCloseTo(5, 14);
    // Σ(x − 5)² over 1…9 = 60; 60 / 8 = 7.5.
    expect(pooled.sd).toBeCloseTo(Math.sqrt(7.5), 14);
  });

  it('agrees with the moments of the values themselves on random samples', () => {
    const sample = fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 2, maxLength: 30 });
    fc.assert(
      fc.property(sample, sample, (a, b) => {
        const pooled = poolMoments(summariseMoments(a), summariseMoments(b));
        const direct = summariseMoments([...a, ...b]);
        expect(pooled.n).toBe(direct.n);
        expect(Math.abs(pooled.mean - direct.mean)).toBeLessThanOrEqual(1e-9 * (1 + Math.abs(direct.mean)));
        expect(Math.abs(pooled.sd - direct.sd)).toBeLessThanOrEqual(1e-9 * (1 + direct.sd));
      }),
      { numRuns: 200 }
    );
  });
});

describe('pooledWithinSd', () => {
  it('is the one-way ANOVA pooled sd: n 10 sd 2 with n 20 sd 3 gives √(207/28)', () => {
    expect(
      pooledWithinSd([
        { n: 10, mean: 0, sd: 2 },
        { n: 20, mean: 5, sd: 3 }
      ])
    ).toBeCloseTo(Math.sqrt((9 * 4 + 19 * 9) / 28), 14);
  });

  it('is undefined without a degree of freedom', () => {
    expect(pooledWithinSd([{ n: 1, mean: 3, sd: 0 }])).toBeUndefined();
  });
});

describe('MomentsFold', () => {
  const moments: fc.Arbitrary<Moments> = fc.record({
    n: fc.integer({ min: 1, max: 500 }),
    mean: fc.double({ min: -1e4, max: 1e4, noNaN: true }),
    sd: fc.double({ min: 0, max: 1e3, noNaN: true })
  });

  it('folds exactly as poolMoments merged one sample after another, and as pooledWithinSd sums', () => {
    const fold = new MomentsFold();
    fc.assert(
      fc.property(fc.array(moments, { minLength: 1, maxLength: 36 }), (parts) => {
        // Reused, as the ranking reuses it: a reset must leave nothing of the previous window.
        fold.reset();
        for (const p of parts) fold.add(p.n, p.mean, p.sd);
        const merged = parts.slice(1).reduce(poolMoments, parts[0]!);
        expect([fold.n, fold.mean, fold.sd]).toEqual([merged.n, merged.mean, merged.sd]);
        expect(fold.count).toBe(parts.length);
        let df = 0;
        let ss = 0;
        for (const p of parts) {
          df += p.n - 1;
          ss += (p.n - 1) * p.sd * p.sd;
        }
        expect(fold.withinSd()).toBe(df > 0 ? Math.sqrt(ss / df) : undefined);
      }),
      { numRuns: 300 }
    );
  });
});
