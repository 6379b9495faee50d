import jStat from 'jstat';
import { gammaQuantile, regularizedGamma } from '../incomplete-gamma';
import { digamma, trigamma } from '../special-functions';
import { formatParameter, type FitRefusal, type FittedModel } from './fitted-model';

/**
 * Two-parameter gamma by maximum likelihood. With s = ln(mean) − mean(ln x), the shape k solves
 * ln k − ψ(k) = s; start k₀ = (3 − s + √((s − 3)² + 24s))/(12s) (Minka 2002, "Estimating a Gamma
 * distribution"), then Newton steps; scale θ = mean/k. Both tails computed directly (incomplete-gamma.ts).
 */
export function fitGamma(values: ArrayLike<number>): FittedModel | FitRefusal {
  const n = values.length;
  let sum = 0;
  let sumLog = 0;
  for (let i = 0; i < n; i += 1) {
    const v = values[i] as number;
    if (!(v > 0)) return { name: 'gamma', reason: 'needs every value above zero' };
    sum += v;
    sumLog += Math.log(v);
  }
  const m = sum / n;
  const s = Math.log(m) - sumLog / n;
  if (!(s > 0)) return { name: 'gamma', reason: 'the values have no spread' };
  let k = (3 - s + Math.sqrt((s - 3) ** 2 + 24 * s)) / (12 * s);
  for (let iter = 0; iter < 50; iter += 1) {
    const step = (Math.log(k) - digamma(k) - s) / (1 / k - trigamma(k));
    const next = k - step > 0 ? k - step : k / 2;
    if (Math.abs(next - k) < 1e-12 * k) {
      k = next;
      break;
    }
    k = next;
  }
  const theta = m / k;
  return gammaModel(k, theta);
}

/** The gamma model with shape k and scale θ; density x^(k−1) e^(−x/θ) / (Γ(k) θ^k), on the log scale. */
export function gammaModel(k: number, theta: number): FittedModel {
  const logNorm = jStat.gammaln(k) + k * Math.log(theta);
  return {
    name: 'gamma',
    label: `gamma (shape ${formatParameter(k)}, scale ${formatParameter(theta)})`,
    parameters: { shape: k, scale: theta },
    cdf: (x) => (x <= 0 ? 0 : regularizedGamma(k, x / theta).p),
    pdf: (x) => (x <= 0 ? 0 : Math.exp((k - 1) * Math.log(x) - x / theta - logNorm)),
    sf: (x) => (x <= 0 ? 1 : regularizedGamma(k, x / theta).q),
    quantile: (p) => gammaQuantile(p, k, theta)
  };
}
