import { andersonDarlingNormal, andersonDarlingNormalP, andersonDarlingStatistic } from './anderson-darling';
import type { ModelCandidate } from './capability-result';
import { mean, sampleSd } from './moments';
import { boxCoxModel, fitBoxCox } from './models/box-cox-fit';
import { exponentialModel, fitExponential } from './models/exponential-fit';
import { MODEL_NAMES, type FitRefusal, type FittedModel, type ModelName } from './models/fitted-model';
import { fitGamma, gammaModel } from './models/gamma-fit';
import { fitJohnson, johnsonModel, type JohnsonParameters } from './models/johnson-fit';
import { fitLognormal, lognormalModel } from './models/lognormal-fit';
import { normalModel } from './models/normal-model';
import { fitWeibull, weibullModel } from './models/weibull-fit';

/**
 * Fits candidate models and judges each by the Anderson–Darling statistic of its fitted CDF on the data.
 *
 * Acceptance at the 5 % level:
 * - normal and lognormal: the composite normal test (on ln x for the lognormal), p from D'Agostino & Stephens
 *   (1986) Table 4.9 applied to A²·(1 + 0.75/n + 2.25/n²);
 * - Box-Cox and Johnson: the same test on the transformed data; the transformation was estimated from the same
 *   data, which this p ignores (it is optimistic);
 * - Weibull: A²·(1 + 0.2/√n) below 0.757; exponential: A²·(1 + 0.6/n) below 1.321; gamma: A² below 0.752 —
 *   critical points of the estimated-parameter cases as tabled in D'Agostino & Stephens (1986) ch. 4, quoted
 *   from memory (the gamma one depends a little on the shape; 0.752 is its large-shape value).
 * Candidates are ranked accepted first, then by A² (smaller fits better); ties keep the order listed here.
 */
export const CANDIDATE_ORDER: readonly ModelName[] = MODEL_NAMES;

export interface ModelSearchResult {
  candidates: ModelCandidate[];
  fitted: Map<ModelName, FittedModel>;
  best: FittedModel | undefined;
}

export function isRefusal(f: FittedModel | FitRefusal): f is FitRefusal {
  return 'reason' in f;
}

/**
 * A model rebuilt from the parameters a result carries (`CapabilityResult.modelParameters`), without fitting
 * again: what the charts draw is exactly the model the figures came from.
 */
export function modelFromParameters(name: ModelName, p: Record<string, number>): FittedModel {
  switch (name) {
    case 'normal':
      return normalModel(p.mean!, p.sd!);
    case 'lognormal':
      return lognormalModel(p.mu!, p.sigma!);
    case 'weibull':
      return weibullModel(p.shape!, p.scale!);
    case 'gamma':
      return gammaModel(p.shape!, p.scale!);
    case 'exponential':
      return exponentialModel(p.mean!);
    case 'boxcox':
      return boxCoxModel(p.lambda!, p.mean!, p.sd!);
    case 'johnson':
      return johnsonModel(p as JohnsonParameters);
  }
}

export function fitModel(
  name: ModelName,
  sorted: Float64Array,
  mu: number,
  sd: number
): FittedModel | FitRefusal {
  switch (name) {
    case 'normal':
      return sd > 0 ? normalModel(mu, sd) : { name, reason: 'the values have no spread' };
    case 'lognormal':
      return fitLognormal(sorted);
    case 'weibull':
      return fitWeibull(sorted);
    case 'gamma':
      return fitGamma(sorted);
    case 'exponential':
      return fitExponential(sorted);
    case 'boxcox':
      return fitBoxCox(sorted);
    case 'johnson':
      return fitJohnson(sorted);
  }
}

const NORMAL_NOTE = "p from the composite normal test (D'Agostino & Stephens 1986)";
const TRANSFORMED_NOTE =
  'p from the normal test of the transformed data; the transformation was fitted to the same data, so p is optimistic';

function judge(model: FittedModel, sorted: Float64Array): ModelCandidate {
  const n = sorted.length;
  const ad = andersonDarlingStatistic(sorted, model.cdf, model.sf);
  const base = { model: model.name, label: model.label, ad };
  switch (model.name) {
    case 'lognormal': {
      // The composite test uses the sd with divisor n − 1 on the log scale, not the MLE σ of the fit.
      const logs = sorted.map(Math.log);
      const test = andersonDarlingNormal(logs, mean(logs), sampleSd(logs));
      return { ...base, p: test.p, accepted: test.p >= 0.05, note: `${NORMAL_NOTE}, on ln x` };
    }
    case 'normal':
    case 'boxcox':
    case 'johnson': {
      const p = andersonDarlingNormalP(ad * (1 + 0.75 / n + 2.25 / (n * n)));
      return {
        ...base,
        p,
        accepted: p >= 0.05,
        note: model.name === 'normal' ? NORMAL_NOTE : TRANSFORMED_NOTE
      };
    }
    case 'weibull':
      return {
        ...base,
        accepted: ad * (1 + 0.2 / Math.sqrt(n)) < 0.757,
        note: 'accepted when A²·(1 + 0.2/√n) < 0.757 (5 % point, quoted from memory)'
      };
    case 'exponential':
      return {
        ...base,
        accepted: ad * (1 + 0.6 / n) < 1.321,
        note: 'accepted when A²·(1 + 0.6/n) < 1.321 (5 % point, quoted from memory)'
      };
    case 'gamma':
      return {
        ...base,
        accepted: ad < 0.752,
        note: 'accepted when A² < 0.752 (approximate 5 % point, quoted from memory)'
      };
  }
}

/** Fits the named candidates (all by default) to ascending `sorted` data and ranks them. */
export function searchModels(
  sorted: Float64Array,
  mu: number,
  sd: number,
  names: readonly ModelName[] = CANDIDATE_ORDER
): ModelSearchResult {
  const candidates: ModelCandidate[] = [];
  const fitted = new Map<ModelName, FittedModel>();
  for (const name of names) {
    const f = fitModel(name, sorted, mu, sd);
    if (isRefusal(f)) {
      candidates.push({ model: name, label: name, accepted: false, note: `not fitted: ${f.reason}` });
      continue;
    }
    fitted.set(name, f);
    candidates.push(judge(f, sorted));
  }
  const order = (c: ModelCandidate) => CANDIDATE_ORDER.indexOf(c.model as ModelName);
  candidates.sort(
    (a, b) =>
      Number(b.accepted) - Number(a.accepted) ||
      (a.ad ?? Infinity) - (b.ad ?? Infinity) ||
      order(a) - order(b)
  );
  const top = candidates[0];
  const best = top?.accepted ? fitted.get(top.model as ModelName) : undefined;
  return { candidates, fitted, best };
}
