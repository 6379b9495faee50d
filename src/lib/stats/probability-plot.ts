import jStat from 'jstat';
import type { FittedModel } from './models/fitted-model';

/** Blom's (1958) plotting position of the i-th of n ordered values (1-based): (i − 3/8)/(n + 1/4). */
export function blomPosition(i: number, n: number): number {
  return (i - 0.375) / (n + 0.25);
}

export interface ModelProbabilityPlot {
  /** The model's quantile at each value's plotting position: where the value would lie if the model held. */
  expected: number[];
  /** The ordered values. */
  value: number[];
  /** A pointwise band around the reference line y = x at `level`: where each ordered value falls if the model holds. */
  lower: number[];
  upper: number[];
  level: number;
}

/**
 * A probability plot against a fitted model, thinned evenly to at most `max` points (the first and last kept).
 * The band comes from the distribution of order statistics: under the model, F(X₍ᵢ₎) is the i-th of n uniform
 * order statistics, distributed Beta(i, n − i + 1) (David & Nagaraja, Order Statistics, 3rd ed. 2003, §2.1), so
 * the model's quantiles at that Beta's (1 − level)/2 and (1 + level)/2 points bound the i-th value pointwise.
 * Points outside the band say the model does not describe the data there — most often in the tails, where the
 * ppm are read.
 */
export function modelProbabilityPlot(
  sorted: ArrayLike<number>,
  model: Pick<FittedModel, 'quantile'>,
  level = 0.95,
  max = 400
): ModelProbabilityPlot {
  const n = sorted.length;
  const step = Math.max(1, Math.ceil(n / max));
  const out: ModelProbabilityPlot = { expected: [], value: [], lower: [], upper: [], level };
  const add = (index: number) => {
    const i = index + 1;
    out.value.push(sorted[index] as number);
    out.expected.push(model.quantile(blomPosition(i, n)));
    out.lower.push(model.quantile(jStat.beta.inv((1 - level) / 2, i, n - i + 1)));
    out.upper.push(model.quantile(jStat.beta.inv((1 + level) / 2, i, n - i + 1)));
  };
  for (let index = 0; index < n; index += step) add(index);
  if ((n - 1) % step !== 0) add(n - 1);
  return out;
}
