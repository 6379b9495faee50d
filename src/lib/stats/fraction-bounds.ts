import type { FigureInterval } from './capability-result';
import type { IndexInterval } from './confidence-bounds';
import { normalSf, normalUpperQuantile } from './normal-distribution';

/**
 * Intervals on zMin, the total out-of-specification fraction (as ppm) and the z-level, derived from those on
 * Ppk (Bissell) and Pp (chi-square) of a normal model: the nearer limit sits 3·Ppk standard deviations from the
 * mean and the farther 3·(2·Pp − Ppk), so taking both indices at the same end of their intervals bounds the
 * fraction. An approximation (the two indices are not independent), stated as such in the results. With a
 * one-sided specification (no Pp) only the nearer limit counts.
 */
export function fractionIntervals(
  ppk: IndexInterval,
  pp: IndexInterval | undefined
): { zMin: FigureInterval; ppmTotal: FigureInterval; zLevel: FigureInterval } {
  const level = ppk.level;
  const fraction = (k: number, p: number | undefined) =>
    Math.min(1, normalSf(3 * k) + (p === undefined ? 0 : normalSf(3 * (2 * p - k))));
  const worst = fraction(ppk.lower, pp?.lower);
  const best = fraction(ppk.upper, pp?.upper);
  const worstOneSided = fraction(ppk.lowerBound, pp?.lowerBound);
  return {
    zMin: { lower: 3 * ppk.lower, upper: 3 * ppk.upper, lowerBound: 3 * ppk.lowerBound, level },
    ppmTotal: { lower: best * 1e6, upper: worst * 1e6, upperBound: worstOneSided * 1e6, level },
    zLevel: {
      lower: normalUpperQuantile(worst),
      upper: normalUpperQuantile(best),
      lowerBound: normalUpperQuantile(worstOneSided),
      level
    }
  };
}
