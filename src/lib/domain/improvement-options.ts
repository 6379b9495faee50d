import type { Specification } from '../stats/specification';
import { normalTailFractions, type TailFractions } from '../stats/tail-fractions';
import { shortTermShift, type ContextProfile } from './context-profile';
import { costPerYear, requiredZ } from './portfolio-ranking';
import type { CharacteristicRow, ProcessRow } from './portfolio-terms';
import { limitsFor } from './specification-history';

/**
 * The choice a project starts with: move the mean, shrink the spread, or both — side by side, each with the
 * z-level, ppm and yearly cost of poor quality it would give, under the normal model of the characteristic's
 * window (mean and sd as the figures give them; the within sd where there is one, as Cpk uses it).
 *
 * - centring alone: the mean at the target (or the middle of the limits), the sd as it is;
 * - less spread alone: the mean where it is, the sd that just meets the requirement;
 * - both: the mean centred and the sd that then just meets it.
 * The process's other characteristics are held as they are, so the cost is the process's cost with this one
 * characteristic changed. These are what-ifs on a model; the project measures what it achieves.
 */
export interface ImprovementOption {
  name: 'now' | 'centring' | 'spread' | 'both';
  label: string;
  mean: number;
  sd: number;
  /** The characteristic's z-level as the context reports it. */
  z: number;
  /** Defective units per million of this characteristic. */
  ppm: number;
  /** The process's cost of poor quality per year with this characteristic so. */
  costPerYear: number;
  /** Whether the characteristic then meets its required level. */
  meets: boolean;
}

/**
 * The z an option is judged on, as the ranking judges it: the nearer-limit distance zMin (= 3·Cpk) in index
 * contexts, the one-tail equivalent of the whole fraction otherwise.
 */
function judgedZ(tails: TailFractions, profile: ContextProfile): number {
  return profile.measure === 'index' ? (tails.zMin ?? tails.zLevel) : tails.zLevel;
}

/** The sd at which a mean gives exactly the required z (by bisection on the normal tails; z falls as sd grows). */
function sdForZ(mean: number, spec: Specification, zWanted: number, profile: ContextProfile): number {
  const z = (sd: number) => judgedZ(normalTailFractions(mean, sd, spec), profile);
  let lo = 1e-12;
  let hi = Math.max(Math.abs((spec.usl ?? mean) - mean), Math.abs(mean - (spec.lsl ?? mean)), 1e-9) * 10;
  if (z(hi) >= zWanted) return hi;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (z(mid) >= zWanted) lo = mid;
    else hi = mid;
  }
  return lo;
}

export function improvementOptions(
  row: ProcessRow,
  ch: CharacteristicRow,
  period: string
): ImprovementOption[] | undefined {
  const r = ch.result;
  const profile: ContextProfile | undefined = row.profile;
  if (!r || !profile || (r.kind !== 'measured' && r.kind !== 'summary') || r.mean === undefined)
    return undefined;
  const sdNow = r.sdWithin ?? r.sdOverall;
  if (sdNow === undefined || !(sdNow > 0)) return undefined;
  const { lsl, usl, target } = limitsFor(ch.characteristic, period);
  if (lsl === undefined && usl === undefined) return undefined;
  const shift = shortTermShift(profile);
  const needZ = requiredZ(profile, ch.characteristic.riskClass) - shift;
  const spec: Specification = {
    ...(lsl !== undefined ? { lsl } : {}),
    ...(usl !== undefined ? { usl } : {})
  };
  const others = row.characteristics
    .filter((x) => x !== ch && x.result)
    .reduce((a, x) => a * x.result!.yield, 1);
  const centre = target ?? (lsl !== undefined && usl !== undefined ? (lsl + usl) / 2 : r.mean);
  const option = (
    name: ImprovementOption['name'],
    label: string,
    mean: number,
    sd: number
  ): ImprovementOption => {
    const tails = normalTailFractions(mean, sd, spec);
    return {
      name,
      label,
      mean,
      sd,
      z: tails.zLevel + shift,
      ppm: tails.total * 1e6,
      costPerYear: costPerYear(1 - others * (1 - tails.total), row.process),
      meets: judgedZ(tails, profile) >= needZ - 1e-9
    };
  };
  return [
    option('now', 'as it runs now', r.mean, sdNow),
    option('centring', 'centring alone (spread as now)', centre, sdNow),
    option('spread', 'less spread alone (mean as now)', r.mean, sdForZ(r.mean, spec, needZ, profile)),
    option(
      'both',
      'centred, with the spread that then meets it',
      centre,
      sdForZ(centre, spec, needZ, profile)
    )
  ];
}
