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
  const worst = fractionAt(ppk.lower, pp?.lower);
  const best = fractionAt(ppk.upper, pp?.upper);
  const worstOneSided = fractionUpperBound(ppk.lowerBound, pp?.lowerBound);
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

/** The fraction out of specification when Ppk and Pp take these values (the rule above). */
function fractionAt(k: number, p: number | undefined): number {
  return Math.min(1, normalSf(3 * k) + (p === undefined ? 0 : normalSf(3 * (2 * p - k))));
}

/**
 * The one-sided upper bound of the fraction out of specification alone, from the lower bounds of Ppk and Pp:
 * the `ppmTotal.upperBound` of fractionIntervals (÷10⁶), what the portfolio judges on. Its z-level bound is
 * normalUpperQuantile of it.
 */
export function fractionUpperBound(ppkLowerBound: number, ppLowerBound: number | undefined): number {
  return fractionAt(ppkLowerBound, ppLowerBound);
}
