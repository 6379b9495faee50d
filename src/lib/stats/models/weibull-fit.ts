import { formatParameter, type FitRefusal, type FittedModel } from './fitted-model';

/**
 * Two-parameter Weibull by maximum likelihood. The shape k solves
 *   Σxᵏ·ln x / Σxᵏ − 1/k − mean(ln x) = 0
 * (Cohen 1965, Technometrics 7), by Newton's method from the log-moment start k₀ = 1.2825/sd(ln x); then the
 * scale λ = (Σxᵏ/n)^(1/k). Values are divided by their maximum first so that xᵏ cannot overflow.
 */
export function fitWeibull(values: ArrayLike<number>): FittedModel | FitRefusal {
  const n = values.length;
  let max = 0;
  for (let i = 0; i < n; i += 1) {
    const v = values[i] as number;
    if (!(v > 0)) return { name: 'weibull', reason: 'needs every value above zero' };
    if (v > max) max = v;
  }
  const logs = new Float64Array(n);
  let meanLog = 0;
  for (let i = 0; i < n; i += 1) {
    logs[i] = Math.log((values[i] as number) / max);
    meanLog += logs[i] as number;
  }
  meanLog /= n;
  let varLog = 0;
  for (let i = 0; i < n; i += 1) varLog += ((logs[i] as number) - meanLog) ** 2;
  varLog /= n - 1;
  if (!(varLog > 0)) return { name: 'weibull', reason: 'the values have no spread' };
  let k = 1.2825 / Math.sqrt(varLog);
  let converged = false;
  for (let iter = 0; iter < 100; iter += 1) {
    let a = 0; // Σ xᵏ
    let b = 0; // Σ xᵏ ln x
    let c = 0; // Σ xᵏ (ln x)²
    for (let i = 0; i < n; i += 1) {
      const l = logs[i] as number;
      const xk = Math.exp(k * l);
      a += xk;
      b += xk * l;
      c += xk * l * l;
    }
    const g = b / a - 1 / k - meanLog;
    const dg = (c * a - b * b) / (a * a) + 1 / (k * k);
    let step = g / dg;
    // Keep k positive: halve a step that would cross zero.
    while (k - step <= 0) step /= 2;
    k -= step;
    if (Math.abs(step) < 1e-12 * k) {
      converged = true;
      break;
    }
  }
  if (!converged || !Number.isFinite(k))
    return { name: 'weibull', reason: 'the likelihood equation did not converge' };
  let a = 0;
  for (let i = 0; i < n; i += 1) a += Math.exp(k * (logs[i] as number));
  const scale = max * (a / n) ** (1 / k);
  return weibullModel(k, scale);
}

/** The Weibull model with shape k and scale λ; density (k/λ)(x/λ)^(k−1) e^(−(x/λ)^k). */
export function weibullModel(k: number, scale: number): FittedModel {
  return {
    name: 'weibull',
    label: `Weibull (shape ${formatParameter(k)}, scale ${formatParameter(scale)})`,
    parameters: { shape: k, scale },
    cdf: (x) => (x <= 0 ? 0 : -Math.expm1(-((x / scale) ** k))),
    pdf: (x) => (x <= 0 ? 0 : (k / scale) * (x / scale) ** (k - 1) * Math.exp(-((x / scale) ** k))),
    sf: (x) => (x <= 0 ? 1 : Math.exp(-((x / scale) ** k))),
    quantile: (p) => scale * (-Math.log1p(-p)) ** (1 / k)
  };
}
