import { normalSf, normalUpperQuantile } from './normal-distribution';

/**
 * Conversions between a fraction out of specification, ppm, yield and z-level (one-tail equivalent).
 *
 * The 1.5σ shift (common practice in Six Sigma reporting, Harry 1988; no standard defines it): a long-term z is
 * reported as a "short-term sigma level" by adding 1.5, so 3.4 ppm ↔ z 4.5 long-term ↔ 6.0 short-term. The shift
 * is applied only when asked for, and the caller labels the result.
 */
export const SIGMA_SHIFT = 1.5;

export function ppmFromFraction(p: number): number {
  return p * 1e6;
}

/** z-level from ppm: Q⁻¹(ppm/10⁶). Example: zFromPpm(3.4) ≈ 4.49985. */
export function zFromPpm(ppm: number): number {
  if (!(ppm >= 0 && ppm <= 1e6)) throw new RangeError(`ppm must lie between 0 and 1 000 000, got ${ppm}`);
  return normalUpperQuantile(ppm / 1e6);
}

/** ppm from a z-level: Q(z)·10⁶. Example: ppmFromZ(3) ≈ 1349.898. */
export function ppmFromZ(z: number): number {
  return normalSf(z) * 1e6;
}

/** z-level from a yield given as a fraction (0.9973 → 2.78). */
export function zFromYield(yieldFraction: number): number {
  if (!(yieldFraction >= 0 && yieldFraction <= 1))
    throw new RangeError(`yield must lie between 0 and 1, got ${yieldFraction}`);
  return normalUpperQuantile(1 - yieldFraction);
}

/** Long-term z → short-term sigma level with the shift added (when the reporting context asks for it). */
export function shortTermLevel(longTermZ: number, shift: number = SIGMA_SHIFT): number {
  return longTermZ + shift;
}

/** Short-term sigma level → long-term z with the shift removed. */
export function longTermZ(shortTermSigmaLevel: number, shift: number = SIGMA_SHIFT): number {
  return shortTermSigmaLevel - shift;
}

/** Yield of a process whose characteristics are independent: the product of their yields. */
export function combinedYield(yields: readonly number[]): number {
  return yields.reduce((product, y) => product * y, 1);
}

/** Rolled throughput yield of sequential steps (first-pass yields multiplied; independence assumed). */
export function rolledThroughputYield(stepYields: readonly number[]): number {
  return combinedYield(stepYields);
}
