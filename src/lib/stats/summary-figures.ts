import { indices, type IndexSet } from './capability-indices';
import { mean, sampleVariance } from './moments';
import { sigmaFromMovingRange } from './sigma-estimators';
import type { Specification } from './specification';
import { normalTailFractions, type TailFractions } from './tail-fractions';

/**
 * The quick normal-model figures of individual values — mean, overall sd, moving-range sigma, Cp/Cpk, Pp/Ppk,
 * ppm and z-level — without the normality test, stability rules or intervals. For live previews while values
 * are typed, and as the engine's fast path in benchmarks. Same formulas as analyzeMeasured's normal branch.
 */
export interface SummaryFigures {
  n: number;
  mean: number;
  sdOverall: number;
  sdWithin: number;
  within: IndexSet;
  overall: IndexSet;
  tails: TailFractions;
}

export function summaryFigures(values: ArrayLike<number>, spec: Specification): SummaryFigures {
  const m = mean(values);
  const sdOverall = Math.sqrt(sampleVariance(values, m));
  const sdWithin = sigmaFromMovingRange(values);
  return {
    n: values.length,
    mean: m,
    sdOverall,
    sdWithin,
    within: indices(m, sdWithin, spec),
    overall: indices(m, sdOverall, spec),
    tails: normalTailFractions(m, sdOverall, spec)
  };
}
