import { sampleVariance, mean } from '../moments';
import { normalCdf, normalPdf, normalQuantile, normalSf } from '../normal-distribution';
import { formatParameter, type FitRefusal, type FittedModel } from './fitted-model';

/** y(λ) = (x^λ − 1)/λ, or ln x at λ = 0 (Box & Cox 1964, JRSS B 26). */
export function boxCoxTransform(x: number, lambda: number): number {
  const l = Math.log(x);
  return Math.abs(lambda) < 1e-12 ? l : Math.expm1(lambda * l) / lambda;
}

/**
 * Profile log-likelihood of λ for an i.i.d. normal model of the transformed data:
 *   ℓ(λ) = (λ − 1)·Σ ln x − (n/2)·ln σ̂²(λ), σ̂² the variance of y(λ) with divisor n
 * (Box & Cox 1964, eq. 8; the same function as scipy.stats.boxcox_llf).
 */
export function boxCoxLogLikelihood(logs: Float64Array, sumLog: number, lambda: number): number {
  const n = logs.length;
  const y = new Float64Array(n);
  for (let i = 0; i < n; i += 1) {
    const l = logs[i] as number;
    y[i] = Math.abs(lambda) < 1e-12 ? l : Math.expm1(lambda * l) / lambda;
  }
  const variance = (sampleVariance(y) * (n - 1)) / n;
  return (lambda - 1) * sumLog - (n / 2) * Math.log(variance);
}

/**
 * λ by maximum profile likelihood on [−5, 5]: a grid of step 0.25 brackets the maximum, golden-section search
 * refines it to 1e-9. Checked against scipy.stats.boxcox_normmax(method='mle') in the tests.
 */
export function boxCoxLambda(values: ArrayLike<number>): number {
  const n = values.length;
  const logs = new Float64Array(n);
  let sumLog = 0;
  for (let i = 0; i < n; i += 1) {
    logs[i] = Math.log(values[i] as number);
    sumLog += logs[i] as number;
  }
  const f = (l: number) => boxCoxLogLikelihood(logs, sumLog, l);
  let best = -5;
  let bestValue = -Infinity;
  for (let l = -5; l <= 5 + 1e-9; l += 0.25) {
    const v = f(l);
    if (v > bestValue) {
      bestValue = v;
      best = l;
    }
  }
  let a = Math.max(-5, best - 0.25);
  let b = Math.min(5, best + 0.25);
  const ratio = (Math.sqrt(5) - 1) / 2;
  let c = b - ratio * (b - a);
  let d = a + ratio * (b - a);
  let fc = f(c);
  let fd = f(d);
  while (b - a > 1e-9) {
    if (fc > fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - ratio * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + ratio * (b - a);
      fd = f(d);
    }
  }
  return (a + b) / 2;
}

/** Box-Cox model: λ by profile likelihood, then a normal model (mean, sd with n − 1) of the transformed values. */
export function fitBoxCox(values: ArrayLike<number>): FittedModel | FitRefusal {
  const n = values.length;
  for (let i = 0; i < n; i += 1) {
    if (!((values[i] as number) > 0)) return { name: 'boxcox', reason: 'needs every value above zero' };
  }
  const lambda = boxCoxLambda(values);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i += 1) y[i] = boxCoxTransform(values[i] as number, lambda);
  const mu = mean(y);
  const sigma = Math.sqrt(sampleVariance(y, mu));
  if (!(sigma > 0)) return { name: 'boxcox', reason: 'the transformed values have no spread' };
  return boxCoxModel(lambda, mu, sigma);
}

/**
 * The Box-Cox model: y = (x^λ − 1)/λ (ln x at λ = 0) normal with mean μ and sd σ. Density by the change of
 * variable, f(x) = φ((y − μ)/σ)/σ · x^(λ−1).
 */
export function boxCoxModel(lambda: number, mu: number, sigma: number): FittedModel {
  const zOf = (x: number) => (boxCoxTransform(x, lambda) - mu) / sigma;
  // For λ > 0 the transformed scale ends at −1/λ (x = 0): the normal model's mass beyond it belongs to no
  // positive x. It is reported, and counted at x ≤ 0, so that tails and quantiles stay consistent.
  const massAtZero = lambda > 1e-12 ? normalCdf((-1 / lambda - mu) / sigma) : 0;
  return {
    name: 'boxcox',
    label: `Box-Cox (λ ${formatParameter(lambda)}; transformed mean ${formatParameter(mu)}, sd ${formatParameter(sigma)})`,
    parameters: { lambda, mean: mu, sd: sigma, massAtZero },
    cdf: (x) => (x <= 0 ? massAtZero : normalCdf(zOf(x))),
    pdf: (x) => (x <= 0 ? 0 : (normalPdf(zOf(x)) / sigma) * x ** (lambda - 1)),
    sf: (x) => (x <= 0 ? 1 - massAtZero : normalSf(zOf(x))),
    quantile: (p) => {
      const yq = mu + sigma * normalQuantile(p);
      if (Math.abs(lambda) < 1e-12) return Math.exp(yq);
      const base = lambda * yq + 1;
      return base <= 0 ? 0 : base ** (1 / lambda);
    }
  };
}
