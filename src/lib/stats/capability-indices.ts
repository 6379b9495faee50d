import type { Specification } from './specification';

/**
 * Capability indices of a normal model (Montgomery, Introduction to Statistical Quality Control, 6th ed., §8.3;
 * ISO 22514-2; NIST/SEMATECH e-Handbook §6.1.6):
 *   Cp = (USL − LSL)/(6σ), Cpl = (μ − LSL)/(3σ), Cpu = (USL − μ)/(3σ), Cpk = min(Cpl, Cpu)
 *   Cpm = (USL − LSL)/(6·√(σ² + (μ − T)²))  (Chan, Cheng & Spiring 1988)
 * With σ the within (short-term) sigma these are Cp/Cpk; with the overall sigma, Pp/Ppk. An index that needs a
 * missing limit is left out, never invented: one-sided specifications have only Cpl or Cpu, and Cpk equals it.
 */
export interface IndexSet {
  /** Two-sided spread index (Cp or Pp); needs both limits. */
  spread?: number;
  lower?: number;
  upper?: number;
  /** Cpk or Ppk: the smaller of the one-sided indices that exist. */
  k?: number;
}

export function indices(mu: number, sigma: number, spec: Specification): IndexSet {
  const out: IndexSet = {};
  if (!(sigma > 0)) return out;
  if (spec.lsl !== undefined && spec.usl !== undefined) out.spread = (spec.usl - spec.lsl) / (6 * sigma);
  if (spec.lsl !== undefined) out.lower = (mu - spec.lsl) / (3 * sigma);
  if (spec.usl !== undefined) out.upper = (spec.usl - mu) / (3 * sigma);
  // The nearer side; written out, since an array per call showed at portfolio size.
  if (out.lower !== undefined) out.k = out.upper !== undefined ? Math.min(out.lower, out.upper) : out.lower;
  else if (out.upper !== undefined) out.k = out.upper;
  return out;
}

/** Cpm (Taguchi index) with the overall sigma; needs both limits and a target. */
export function cpm(mu: number, sigma: number, spec: Specification): number | undefined {
  if (spec.lsl === undefined || spec.usl === undefined || spec.target === undefined || !(sigma > 0))
    return undefined;
  return (spec.usl - spec.lsl) / (6 * Math.sqrt(sigma * sigma + (mu - spec.target) ** 2));
}
