import { normalCdf, normalSf, normalUpperQuantile } from './normal-distribution';
import type { Specification } from './specification';

/** Expected fractions outside the limits under a model, with z-values to each limit. */
export interface TailFractions {
  below?: number;
  above?: number;
  total: number;
  /** Distance from the mean to each limit in standard deviations: (μ − LSL)/σ and (USL − μ)/σ. */
  zLower?: number;
  zUpper?: number;
  /** The smaller of zLower and zUpper (= 3·Cpk or 3·Ppk). */
  zMin?: number;
  /**
   * One-tail equivalent of the total fraction, Φ⁻¹(1 − p_total) = Q⁻¹(p_total): the single z that puts the whole
   * out-of-spec fraction in one tail. Differs from zMin when both tails matter (limits at ±1σ: zMin 1, zLevel 0.475).
   */
  zLevel: number;
}

/** Normal-model fractions: P(X < LSL) = Φ((LSL − μ)/σ), P(X > USL) = Q((USL − μ)/σ). */
export function normalTailFractions(mu: number, sigma: number, spec: Specification): TailFractions {
  const zLower = spec.lsl !== undefined ? (mu - spec.lsl) / sigma : undefined;
  const zUpper = spec.usl !== undefined ? (spec.usl - mu) / sigma : undefined;
  const below = zLower !== undefined ? normalCdf(-zLower) : undefined;
  const above = zUpper !== undefined ? normalSf(zUpper) : undefined;
  return assemble(below, above, zLower, zUpper);
}

/** Puts the parts together: total, zMin over the limits that exist, and the one-tail z-level. */
function assemble(
  below: number | undefined,
  above: number | undefined,
  zLower: number | undefined,
  zUpper: number | undefined
): TailFractions {
  const total = Math.min(1, (below ?? 0) + (above ?? 0));
  // Built field by field (no spread of temporary objects): this runs for every window of a portfolio.
  const out: TailFractions = { total, zLevel: 0 };
  if (below !== undefined) {
    out.below = below;
    out.zLower = zLower;
  }
  if (above !== undefined) {
    out.above = above;
    out.zUpper = zUpper;
  }
  const zMin = zLower !== undefined && zUpper !== undefined ? Math.min(zLower, zUpper) : (zLower ?? zUpper);
  if (zMin !== undefined) out.zMin = zMin;
  out.zLevel = normalUpperQuantile(total);
  return out;
}

/** Fractions from any model given its CDF and survival function at the limits (non-normal models). */
export function modelTailFractions(
  cdf: (x: number) => number,
  sf: (x: number) => number,
  spec: Specification
): TailFractions {
  const below = spec.lsl !== undefined ? cdf(spec.lsl) : undefined;
  const above = spec.usl !== undefined ? sf(spec.usl) : undefined;
  const zLower = below !== undefined ? normalUpperQuantile(below) : undefined;
  const zUpper = above !== undefined ? normalUpperQuantile(above) : undefined;
  return assemble(below, above, zLower, zUpper);
}
