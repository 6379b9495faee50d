/**
 * Sample quantile by the p(n+1) rule (Hyndman & Fan 1996 type 6; numpy method 'weibull'), clamped to the
 * smallest and largest value outside the range the rule covers. This reproduces the quantiles printed in the
 * NIST/SEMATECH e-Handbook furnace case study. `sorted` must be ascending.
 */
export function quantileType6(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) throw new RangeError('At least 1 value is needed for a quantile');
  if (!(p >= 0 && p <= 1))
    throw new RangeError(`A probability from 0 to 1 is needed for a quantile (got ${p})`);
  const h = p * (n + 1);
  if (h <= 1) return sorted[0] as number;
  if (h >= n) return sorted[n - 1] as number;
  const lo = Math.floor(h);
  const frac = h - lo;
  const a = sorted[lo - 1] as number;
  const b = sorted[lo] as number;
  return a + frac * (b - a);
}

/** Ascending copy in a Float64Array (numeric sort, NaN-free input assumed). */
export function sortedCopy(values: ArrayLike<number>): Float64Array {
  const out = Float64Array.from(values as ArrayLike<number>);
  out.sort();
  return out;
}

/** Median: the middle value, or the mean of the two middle values (undefined for no values). */
export function median(values: ArrayLike<number>): number | undefined {
  const n = values.length;
  if (n === 0) return undefined;
  const s = sortedCopy(values);
  const m = Math.floor(n / 2);
  return n % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

/** Lowest, quartiles (quantileType6), median and highest of a set of values. */
export interface FiveNumbers {
  lowest: number;
  lowerQuartile: number;
  median: number;
  upperQuartile: number;
  highest: number;
}

/**
 * A five-number summary (after Tukey, with quartiles by the p(n+1) rule, quantileType6, in place of his hinges);
 * its median is `median`'s (the rule's value at p = ½). Values in any order; undefined for none; NaN-free input
 * assumed.
 */
export function fiveNumbers(values: ArrayLike<number>): FiveNumbers | undefined {
  if (values.length === 0) return undefined;
  const s = sortedCopy(values);
  return {
    lowest: s[0]!,
    lowerQuartile: quantileType6(s, 0.25),
    median: quantileType6(s, 0.5),
    upperQuartile: quantileType6(s, 0.75),
    highest: s[s.length - 1]!
  };
}
