import { formatParameter, type FitRefusal, type FittedModel } from './fitted-model';

/** One-parameter exponential (origin at zero) by maximum likelihood: mean θ̂ = x̄. */
export function fitExponential(values: ArrayLike<number>): FittedModel | FitRefusal {
  const n = values.length;
  let sum = 0;
  for (let i = 0; i < n; i += 1) {
    const v = values[i] as number;
    if (v < 0) return { name: 'exponential', reason: 'needs every value at or above zero' };
    sum += v;
  }
  const theta = sum / n;
  if (!(theta > 0)) return { name: 'exponential', reason: 'all values are zero' };
  return exponentialModel(theta);
}

/** The exponential model with mean θ; density e^(−x/θ)/θ. */
export function exponentialModel(theta: number): FittedModel {
  return {
    name: 'exponential',
    label: `exponential (mean ${formatParameter(theta)})`,
    parameters: { mean: theta },
    cdf: (x) => (x <= 0 ? 0 : -Math.expm1(-x / theta)),
    pdf: (x) => (x < 0 ? 0 : Math.exp(-x / theta) / theta),
    sf: (x) => (x <= 0 ? 1 : Math.exp(-x / theta)),
    quantile: (p) => -theta * Math.log1p(-p)
  };
}
