import type { Specification } from './specification';

/**
 * Performance indices by the percentile method of ISO 22514-2 (and ISO/TR 22514-4): with X_p the p-quantile of
 * the fitted (or empirical) distribution,
 *   Pp = (USL − LSL)/(X₀.₉₉₈₆₅ − X₀.₀₀₁₃₅),
 *   Ppl = (X₀.₅ − LSL)/(X₀.₅ − X₀.₀₀₁₃₅), Ppu = (USL − X₀.₅)/(X₀.₉₉₈₆₅ − X₀.₅), Ppk = min of those that exist.
 * For a normal model these equal the usual Pp, Ppl, Ppu.
 */
export function percentileIndices(
  quantile: (p: number) => number,
  spec: Specification
): { pp?: number; ppl?: number; ppu?: number; ppk?: number } {
  const lo = quantile(0.00135);
  const med = quantile(0.5);
  const hi = quantile(0.99865);
  const out: { pp?: number; ppl?: number; ppu?: number; ppk?: number } = {};
  if (spec.lsl !== undefined && spec.usl !== undefined && hi > lo) out.pp = (spec.usl - spec.lsl) / (hi - lo);
  if (spec.lsl !== undefined && med > lo) out.ppl = (med - spec.lsl) / (med - lo);
  if (spec.usl !== undefined && hi > med) out.ppu = (spec.usl - med) / (hi - med);
  const sides = [out.ppl, out.ppu].filter((v): v is number => v !== undefined);
  if (sides.length) out.ppk = Math.min(...sides);
  return out;
}
