import { normalCdf, normalPdf, normalQuantile, normalSf } from '../normal-distribution';
import { formatParameter, type FittedModel } from './fitted-model';

/** The normal model with the given mean and standard deviation. */
export function normalModel(mu: number, sigma: number): FittedModel {
  return {
    name: 'normal',
    label: `normal (mean ${formatParameter(mu)}, sd ${formatParameter(sigma)})`,
    parameters: { mean: mu, sd: sigma },
    cdf: (x) => normalCdf((x - mu) / sigma),
    pdf: (x) => normalPdf((x - mu) / sigma) / sigma,
    sf: (x) => normalSf((x - mu) / sigma),
    quantile: (p) => mu + sigma * normalQuantile(p)
  };
}
