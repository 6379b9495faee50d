import { normalCdf, normalPdf, normalQuantile, normalSf } from '../normal-distribution';
import { formatParameter, type FitRefusal, type FittedModel } from './fitted-model';

/**
 * Two-parameter lognormal by maximum likelihood: μ̂ = mean(ln x), σ̂² = Σ(ln x − μ̂)²/n
 * (Johnson, Kotz & Balakrishnan, Continuous Univariate Distributions vol. 1, 2nd ed., §14.4).
 */
export function fitLognormal(values: ArrayLike<number>): FittedModel | FitRefusal {
  const n = values.length;
  let s = 0;
  for (let i = 0; i < n; i += 1) {
    const v = values[i] as number;
    if (!(v > 0)) return { name: 'lognormal', reason: 'needs every value above zero' };
    s += Math.log(v);
  }
  const mu = s / n;
  let ss = 0;
  for (let i = 0; i < n; i += 1) ss += (Math.log(values[i] as number) - mu) ** 2;
  const sigma = Math.sqrt(ss / n);
  if (!(sigma > 0)) return { name: 'lognormal', reason: 'the logarithms have no spread' };
  return lognormalModel(mu, sigma);
}

/** The lognormal model with log-scale mean μ and sd σ; density φ((ln x − μ)/σ)/(σx). */
export function lognormalModel(mu: number, sigma: number): FittedModel {
  return {
    name: 'lognormal',
    label: `lognormal (μ ${formatParameter(mu)}, σ ${formatParameter(sigma)} on the log scale)`,
    parameters: { mu, sigma },
    cdf: (x) => (x <= 0 ? 0 : normalCdf((Math.log(x) - mu) / sigma)),
    pdf: (x) => (x <= 0 ? 0 : normalPdf((Math.log(x) - mu) / sigma) / (sigma * x)),
    sf: (x) => (x <= 0 ? 1 : normalSf((Math.log(x) - mu) / sigma)),
    quantile: (p) => Math.exp(mu + sigma * normalQuantile(p))
  };
}
