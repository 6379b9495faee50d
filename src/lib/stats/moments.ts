import { neumaierSum } from './summation';

/**
 * Arithmetic mean, refined once: m = Σx/n (compensated), then m + Σ(x − m)/n. The correction removes the
 * rounding left in the first pass (Björck, Numerical Methods for Least Squares Problems, 1996, §2.1).
 * Throws on an empty list. Example: mean([1, 2, 3, 4]) === 2.5.
 */
export function mean(values: ArrayLike<number>): number {
  const n = values.length;
  if (n === 0) throw new RangeError('At least 1 value is needed for a mean');
  const first = neumaierSum(values) / n;
  return first + neumaierSum(values, first) / n;
}

/**
 * Sample variance with divisor n − 1, by the corrected two-pass algorithm
 * s² = (Σ(x − m)² − (Σ(x − m))²/n) / (n − 1) (Chan, Golub & LeVeque 1983, "Algorithms for computing the sample
 * variance", The American Statistician 37(3), eq. 1.7), both sums compensated (Neumaier's step, as in
 * neumaierSum, fused into one pass). Never the one-pass Σx² − n·m²,
 * which the NIST StRD NumAcc sets show to lose all digits.
 * Throws for fewer than two values. Example: sampleVariance([2, 4, 4, 4, 5, 5, 7, 9]) === 32 / 7.
 */
export function sampleVariance(values: ArrayLike<number>, knownMean?: number): number {
  const n = values.length;
  if (n < 2) throw new RangeError('At least 2 values are needed for a standard deviation');
  const m = knownMean ?? mean(values);
  let ss = 0;
  let ssC = 0;
  let s = 0;
  let sC = 0;
  for (let i = 0; i < n; i += 1) {
    const d = (values[i] as number) - m;
    const d2 = d * d;
    let t = ss + d2;
    if (Math.abs(ss) >= d2) ssC += ss - t + d2;
    else ssC += d2 - t + ss;
    ss = t;
    t = s + d;
    if (Math.abs(s) >= Math.abs(d)) sC += s - t + d;
    else sC += d - t + s;
    s = t;
  }
  const sumSquares = ss + ssC;
  const sumDeviations = s + sC;
  return Math.max(0, (sumSquares - (sumDeviations * sumDeviations) / n) / (n - 1));
}

/** Sample standard deviation (divisor n − 1): √sampleVariance. Example: sampleSd([2, 4, 4, 4, 5, 5, 7, 9]) ≈ 2.138. */
export function sampleSd(values: ArrayLike<number>, knownMean?: number): number {
  return Math.sqrt(sampleVariance(values, knownMean));
}
