import { normalPdf, normalSf } from './normal-distribution';

/**
 * Is a change of z-level between two periods more than sampling noise?
 *
 * Each z-level gets an approximate standard error, and the difference of two independent estimates is judged
 * by a Wald test: W = (z₂ − z₁) / √(SE₁² + SE₂²), two-sided p = 2·Q(|W|), "more than noise" when p < α.
 *
 * - Measured data (raw or summary): z = (limit − mean)/s. Its large-sample standard error under normality is
 *   √(1/n + z²/(2(n − 1))) — Bissell (1990), "How reliable is your capability index?", Applied Statistics 39(3),
 *   331–340, whose SE of Ĉpk is this divided by 3 (z = 3·Cpk). For a non-normal model it is an approximation.
 * - Counted data: z = Q⁻¹(p) with p the fraction nonconforming of `trials` chances (units, or units ×
 *   opportunities). By the delta method SE(z) = √(p(1 − p)/trials) / φ(z) (common practice). With no or only
 *   nonconforming results the estimate is a bound, not a value, and the change is not tested.
 */
export interface ZEstimate {
  z: number;
  /** Values behind a measured figure, or chances behind a counted one. */
  n: number;
  kind: 'measured' | 'counted';
  /** Counted data: the fraction nonconforming. */
  p?: number;
}

export function zStandardError(e: ZEstimate): number | undefined {
  if (!Number.isFinite(e.z) || !(e.n >= 2)) return undefined;
  if (e.kind === 'measured') return Math.sqrt(1 / e.n + (e.z * e.z) / (2 * (e.n - 1)));
  const p = e.p;
  if (p === undefined || !(p > 0 && p < 1)) return undefined;
  return Math.sqrt((p * (1 - p)) / e.n) / normalPdf(e.z);
}

export interface ZChange {
  change: number;
  standardError?: number;
  statistic?: number;
  pValue?: number;
  /** Undefined when the change cannot be tested (a bound, too few values). */
  beyondNoise?: boolean;
}

export function zChangeTest(before: ZEstimate, after: ZEstimate, alpha = 0.05): ZChange {
  const change = after.z - before.z;
  const a = zStandardError(before);
  const b = zStandardError(after);
  if (a === undefined || b === undefined) return { change };
  const standardError = Math.sqrt(a * a + b * b);
  const statistic = change / standardError;
  const pValue = Math.min(1, 2 * normalSf(Math.abs(statistic)));
  return { change, standardError, statistic, pValue, beyondNoise: pValue < alpha };
}
