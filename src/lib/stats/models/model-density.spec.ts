import { describe, expect, it } from 'vitest';
import { SeededRandom } from '../../../../seed-data/seeded-random';
import { fitModel, isRefusal, modelFromParameters } from '../model-search';
import { mean, sampleSd } from '../moments';
import { sortedCopy } from '../quantiles';
import { MODEL_NAMES, type FittedModel } from './fitted-model';

/**
 * Each model's closed-form density against the derivative of its own CDF (a central difference, checked at
 * the quartiles and 5 %/95 % points), and each model rebuilt from its parameters against the fitted one: the
 * chart draws exactly the model the figures came from.
 */
const rng = new SeededRandom(41);
const skewed = sortedCopy(Array.from({ length: 400 }, () => Math.exp(0.35 * rng.normal()) * 8));

function fitted(name: (typeof MODEL_NAMES)[number]): FittedModel {
  const f = fitModel(name, skewed, mean(skewed), sampleSd(skewed));
  if (isRefusal(f)) throw new Error(`${name}: ${f.reason}`);
  return f;
}

describe('model densities', () => {
  it.each(MODEL_NAMES)('%s: the density is the derivative of the CDF', (name) => {
    const model = fitted(name);
    for (const p of [0.05, 0.25, 0.5, 0.75, 0.95]) {
      const x = model.quantile(p);
      const h = Math.abs(x) * 1e-5 + 1e-7;
      const numeric = (model.cdf(x + h) - model.cdf(x - h)) / (2 * h);
      expect(Math.abs(model.pdf(x) - numeric) / numeric).toBeLessThan(1e-5);
    }
  });

  it.each(MODEL_NAMES)('%s: rebuilt from its parameters, it is the same model', (name) => {
    const model = fitted(name);
    const rebuilt = modelFromParameters(name, { ...model.parameters });
    expect(rebuilt.label).toBe(model.label);
    for (const x of [skewed[10]!, skewed[200]!, skewed[390]!]) {
      expect(rebuilt.cdf(x)).toBe(model.cdf(x));
      expect(rebuilt.pdf(x)).toBe(model.pdf(x));
    }
  });
});
