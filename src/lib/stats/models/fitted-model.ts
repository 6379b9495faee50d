import { plainSignificant } from '../plain-number';

/**
 * The distribution models the engine fits, in the order the model search tries them and ties are broken: the
 * one list of model names (the search, the command line's `--model` and its usage text all read it).
 */
export const MODEL_NAMES = [
  'normal',
  'lognormal',
  'weibull',
  'gamma',
  'exponential',
  'boxcox',
  'johnson'
] as const;
export type ModelName = (typeof MODEL_NAMES)[number];

/** What every distribution fit returns: a model the engine can take tail fractions and quantiles from. */

export interface FittedModel {
  name: ModelName;
  /** Plain-language name with its parameters, e.g. "lognormal (μ = 0.21, σ = 0.34 on the log scale)". */
  label: string;
  parameters: Record<string, number>;
  cdf(x: number): number;
  /** The density f(x) = F′(x), in closed form (charts draw it over a histogram). */
  pdf(x: number): number;
  /** 1 − F(x), computed directly where the family allows it. */
  sf(x: number): number;
  quantile(p: number): number;
}

/** A fit that could not be made, and why (e.g. non-positive values for a lognormal). */
export interface FitRefusal {
  name: ModelName;
  reason: string;
}

export function formatParameter(v: number): string {
  // Four significant digits without trailing zeros, never in exponent form.
  return Number.isFinite(v)
    ? plainSignificant(v, 4)
        .replace(/(\.\d*?)0+$/, '$1')
        .replace(/\.$/, '')
    : String(v);
}
