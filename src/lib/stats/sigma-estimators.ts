import { c4, d2 } from './control-chart-constants';
import { sampleVariance } from './moments';

/**
 * Estimators of the within-subgroup (short-term) standard deviation. Each returns the estimate and the label
 * the result states as its assumption. Formulas as in Montgomery, Introduction to Statistical Quality Control
 * (6th ed.), §6.2–6.4, and ASTM E2587.
 */
export type SigmaEstimator = 'rbar' | 'sbar' | 'pooled' | 'moving-range';

export const SIGMA_ESTIMATOR_LABELS: Record<SigmaEstimator, string> = {
  rbar: 'within sigma from the mean subgroup range, R̄/d2',
  sbar: 'within sigma from the mean subgroup standard deviation, S̄/c4',
  pooled: 'within sigma as the pooled subgroup standard deviation, √(Σ(nᵢ−1)sᵢ²/Σ(nᵢ−1))',
  'moving-range': 'within sigma from the mean moving range of 2, MR̄/d2 (d2 = 1.128)'
};

/** Splits values by subgroup id, keeping the order in which subgroups first appear. */
export function groupBySubgroup(values: ArrayLike<number>, subgroups: readonly string[]): number[][] {
  const groups = new Map<string, number[]>();
  for (let i = 0; i < values.length; i += 1) {
    const key = subgroups[i] as string;
    let g = groups.get(key);
    if (!g) {
      g = [];
      groups.set(key, g);
    }
    g.push(values[i] as number);
  }
  return [...groups.values()];
}

/** Cuts values in order into consecutive subgroups of `size` (a shorter last group is dropped). */
export function consecutiveSubgroups(values: ArrayLike<number>, size: number): number[][] {
  const out: number[][] = [];
  for (let start = 0; start + size <= values.length; start += size) {
    out.push(Array.from({ length: size }, (_, i) => values[start + i] as number));
  }
  return out;
}

/** R̄/d2 over subgroups of size ≥ 2; with unequal sizes, the mean of Rᵢ/d2(nᵢ). Groups of one value are skipped. */
export function sigmaFromRanges(groups: readonly number[][]): number {
  const usable = groups.filter((g) => g.length >= 2);
  if (usable.length === 0)
    throw new RangeError('A subgroup of at least 2 values is needed for the within sigma from ranges');
  let sum = 0;
  for (const g of usable) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of g) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    sum += (hi - lo) / d2(g.length);
  }
  return sum / usable.length;
}

/** S̄/c4 over subgroups of size ≥ 2; with unequal sizes, the mean of sᵢ/c4(nᵢ). */
export function sigmaFromSubgroupSds(groups: readonly number[][]): number {
  const usable = groups.filter((g) => g.length >= 2);
  if (usable.length === 0)
    throw new RangeError(
      'A subgroup of at least 2 values is needed for the within sigma from subgroup standard deviations'
    );
  let sum = 0;
  for (const g of usable) sum += Math.sqrt(sampleVariance(g)) / c4(g.length);
  return sum / usable.length;
}

/** Pooled standard deviation √(Σ(nᵢ−1)sᵢ²/Σ(nᵢ−1)), no bias correction. */
export function pooledSd(groups: readonly number[][]): number {
  let ss = 0;
  let df = 0;
  for (const g of groups) {
    if (g.length < 2) continue;
    ss += (g.length - 1) * sampleVariance(g);
    df += g.length - 1;
  }
  if (df === 0)
    throw new RangeError('A subgroup of at least 2 values is needed for a pooled standard deviation');
  return Math.sqrt(ss / df);
}

/** Mean moving range of span 2, MR̄ = Σ|xᵢ − xᵢ₋₁|/(n − 1). */
export function meanMovingRange(values: ArrayLike<number>): number {
  if (values.length < 2) throw new RangeError('At least 2 values are needed for a moving range');
  let sum = 0;
  for (let i = 1; i < values.length; i += 1)
    sum += Math.abs((values[i] as number) - (values[i - 1] as number));
  return sum / (values.length - 1);
}

/** MR̄/d2 with d2(2) = 1.128, the within sigma for individual values. */
export function sigmaFromMovingRange(values: ArrayLike<number>): number {
  return meanMovingRange(values) / d2(2);
}

/**
 * The default estimator for a data shape (common practice): individual values → moving range; equal subgroups
 * of up to 10 → ranges; larger equal subgroups → subgroup standard deviations; unequal subgroups → pooled.
 */
export function defaultEstimator(groups: readonly number[][] | undefined): SigmaEstimator {
  if (!groups || groups.length === 0) return 'moving-range';
  const sizes = new Set(groups.map((g) => g.length));
  if (sizes.size > 1) return 'pooled';
  const size = groups[0]?.length ?? 1;
  if (size < 2) return 'moving-range';
  return size <= 10 ? 'rbar' : 'sbar';
}

/** Estimates the within sigma with the chosen estimator. */
export function withinSigma(
  estimator: SigmaEstimator,
  values: ArrayLike<number>,
  groups: readonly number[][] | undefined
): number {
  switch (estimator) {
    case 'moving-range':
      return sigmaFromMovingRange(values);
    case 'rbar':
      return sigmaFromRanges(requireGroups(groups, estimator));
    case 'sbar':
      return sigmaFromSubgroupSds(requireGroups(groups, estimator));
    case 'pooled':
      return pooledSd(requireGroups(groups, estimator));
  }
}

function requireGroups(
  groups: readonly number[][] | undefined,
  estimator: SigmaEstimator
): readonly number[][] {
  if (!groups || groups.length === 0) {
    throw new RangeError(`The ${estimator} estimator needs subgroups; give subgroup ids or a subgroup size`);
  }
  return groups;
}
