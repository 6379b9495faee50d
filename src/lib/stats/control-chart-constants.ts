import jStat from 'jstat';
import { normalCdf } from './normal-distribution';

/**
 * Control-chart constants d2, d3, c4 for subgroup sizes 2…25.
 *
 * Source: n = 2…20 from "Table A.22 Factors for Constructing Control Charts" (Walpole, Myers, Myers & Ye,
 * Probability & Statistics for Engineers & Scientists, Appendix A); n = 21…25 from the ASTM table reproduced in
 * Joglekar (2003), Statistical Methods for Six Sigma, Appendix G, where the scan's d3 for n = 21 and 23 has
 * typographical errors and the exact values are used instead. The engine uses these published values, so figures
 * agree with a hand calculation from the same table; sizes above 25 use the exact forms below.
 * Tests check every entry against c4Exact and d2Exact to within one unit of the last published digit.
 */
export const CONTROL_CHART_TABLE: Readonly<Record<number, { d2: number; d3: number; c4: number }>> = {
  2: { d2: 1.128, d3: 0.853, c4: 0.7979 },
  3: { d2: 1.693, d3: 0.888, c4: 0.8862 },
  4: { d2: 2.059, d3: 0.88, c4: 0.9213 },
  5: { d2: 2.326, d3: 0.864, c4: 0.94 },
  6: { d2: 2.534, d3: 0.848, c4: 0.9515 },
  7: { d2: 2.704, d3: 0.833, c4: 0.9594 },
  8: { d2: 2.847, d3: 0.82, c4: 0.965 },
  9: { d2: 2.97, d3: 0.808, c4: 0.9693 },
  10: { d2: 3.078, d3: 0.797, c4: 0.9727 },
  11: { d2: 3.173, d3: 0.787, c4: 0.9754 },
  12: { d2: 3.258, d3: 0.778, c4: 0.9776 },
  13: { d2: 3.336, d3: 0.77, c4: 0.9794 },
  14: { d2: 3.407, d3: 0.763, c4: 0.981 },
  15: { d2: 3.472, d3: 0.756, c4: 0.9823 },
  16: { d2: 3.532, d3: 0.75, c4: 0.9835 },
  17: { d2: 3.588, d3: 0.744, c4: 0.9845 },
  18: { d2: 3.64, d3: 0.739, c4: 0.9854 },
  19: { d2: 3.689, d3: 0.734, c4: 0.9862 },
  20: { d2: 3.735, d3: 0.729, c4: 0.9869 },
  21: { d2: 3.778, d3: 0.7242, c4: 0.9876 },
  22: { d2: 3.819, d3: 0.7199, c4: 0.9882 },
  23: { d2: 3.858, d3: 0.7159, c4: 0.9887 },
  24: { d2: 3.895, d3: 0.7121, c4: 0.9892 },
  25: { d2: 3.931, d3: 0.7084, c4: 0.9896 }
};

/** c4(n) = √(2/(n−1))·Γ(n/2)/Γ((n−1)/2): E[s] = c4·σ for normal samples of size n (Montgomery, Introduction to Statistical Quality Control, 6th ed., §6.2). */
export function c4Exact(n: number): number {
  if (!(n >= 2)) throw new RangeError(`A subgroup size of at least 2 is needed for c4 (got ${n})`);
  return Math.sqrt(2 / (n - 1)) * Math.exp(jStat.gammaln(n / 2) - jStat.gammaln((n - 1) / 2));
}

/**
 * d2(n) = ∫ [1 − Φ(x)ⁿ − (1 − Φ(x))ⁿ] dx over the real line: the mean range of n standard normal values
 * (Tippett 1925). Evaluated by composite Simpson's rule on [−12, 12] with 6 000 panels (error far below 1e-10).
 */
export function d2Exact(n: number): number {
  if (!(n >= 2)) throw new RangeError(`A subgroup size of at least 2 is needed for d2 (got ${n})`);
  const a = -12;
  const b = 12;
  const panels = 6000;
  const h = (b - a) / panels;
  const f = (x: number) => {
    const p = normalCdf(x);
    return 1 - p ** n - (1 - p) ** n;
  };
  let sum = f(a) + f(b);
  for (let i = 1; i < panels; i += 1) sum += (i % 2 === 0 ? 2 : 4) * f(a + i * h);
  return (sum * h) / 3;
}

const exactD2Cache = new Map<number, number>();

/** d2 for a subgroup size: the published value for 2…25, the exact one above. */
export function d2(n: number): number {
  const row = CONTROL_CHART_TABLE[n];
  if (row) return row.d2;
  if (!Number.isInteger(n) || n < 2)
    throw new RangeError(`A whole subgroup size of at least 2 is needed for d2 (got ${n})`);
  let v = exactD2Cache.get(n);
  if (v === undefined) {
    v = d2Exact(n);
    exactD2Cache.set(n, v);
  }
  return v;
}

/** c4 for a sample size: the published value for 2…25, the exact one above. */
export function c4(n: number): number {
  const row = CONTROL_CHART_TABLE[n];
  if (row) return row.c4;
  if (!Number.isInteger(n) || n < 2) throw new RangeError(`c4 requires a whole sample size ≥ 2, got ${n}`);
  return c4Exact(n);
}

/** d3 (sd of the range of n standard normal values) for 2…25 from the table; undefined above, where no R chart is drawn. */
export function d3(n: number): number | undefined {
  return CONTROL_CHART_TABLE[n]?.d3;
}
