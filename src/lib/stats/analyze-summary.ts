import { WarningList } from './result-warnings';
import { cpm as cpmIndex, indices } from './capability-indices';
import type { CapabilityResult } from './capability-result';
import {
  bissellInterval,
  bissellLowerBound,
  cpmInterval,
  spreadIndexInterval,
  spreadIndexLowerBound,
  type IndexInterval
} from './confidence-bounds';
import { fractionIntervals, fractionUpperBound } from './fraction-bounds';
import { normalUpperQuantile } from './normal-distribution';
import { checkSpecification, type Specification } from './specification';
import { normalTailFractions } from './tail-fractions';

export interface SummaryOptions {
  spec: Specification;
  /** A within sigma known from the parts of a merged summary (pooled within-month sd); enables Cp/Cpk. */
  sdWithin?: number;
  sdWithinLabel?: string;
  confidence?: number;
  shortTermShift?: number;
  requiredIndex?: number;
}

/**
 * Capability from a reported summary (n, mean, sd with n − 1): the normal-model figures with the overall sigma.
 * Marked "summary only": with no values, normality and stability cannot be checked, and with no subgroups there
 * is no within sigma, so Cp/Cpk are not reported (Pp/Ppk are).
 */
/** Refuses a summary no analysis can use (RangeError with what is wrong). */
export function checkSummary(n: number, mu: number, sd: number, spec: Specification): void {
  checkSpecification(spec);
  if (!(Number.isInteger(n) && n >= 2))
    throw new RangeError(`n must be a whole number of at least 2, got ${n}`);
  if (!Number.isFinite(mu)) throw new RangeError('The mean must be a finite number');
  if (!(Number.isFinite(sd) && sd >= 0))
    throw new RangeError('The standard deviation must be a finite number ≥ 0');
}

/**
 * The figures of a summary with a positive sd, without words: indices and normal tails with the overall sigma,
 * their intervals (chi-square for Pp, Bissell for Ppk, and the fraction bounds derived from both), and the same
 * with a within sigma when one is known. `analyzeSummary` builds its result from these; the portfolio keeps only
 * these for each window (domain/window-figures.ts) — one computation, so the two can never disagree.
 */
export interface SummaryCore {
  overall: ReturnType<typeof indices>;
  tails: ReturnType<typeof normalTailFractions>;
  pp?: IndexInterval;
  ppk?: IndexInterval;
  fraction?: ReturnType<typeof fractionIntervals>;
  within?: { sd: number; indices: ReturnType<typeof indices>; cp?: IndexInterval; cpk?: IndexInterval };
}

/** What both computations of a summary take: n, mean and sd (n − 1), the limits, a level, and a within sd. */
type SummaryInput = [
  n: number,
  mu: number,
  sd: number,
  spec: Specification,
  level: number,
  sdWithin?: number
];

export function summaryCore(...input: SummaryInput): SummaryCore {
  const [n, , , , level] = input;
  // Which intervals exist is decided once, by summaryBounds; the two-sided ones are added to its bounds.
  const bounds = summaryBounds(...input);
  const { overall, within } = bounds;
  const core: SummaryCore = { overall, tails: bounds.tails };
  if (overall.spread !== undefined) core.pp = spreadIndexInterval(overall.spread, n, level);
  if (overall.k !== undefined && bounds.ppkLower !== undefined) {
    core.ppk = bissellInterval(overall.k, n, level);
    core.fraction = fractionIntervals(core.ppk, core.pp);
  }
  if (within) {
    const w = within.indices;
    core.within = { sd: within.sd, indices: w };
    if (w.spread !== undefined) core.within.cp = spreadIndexInterval(w.spread, n, level);
    if (w.k !== undefined && within.cpkLower !== undefined) core.within.cpk = bissellInterval(w.k, n, level);
  }
  return core;
}

/**
 * The one-sided bounds of a summary alone (no two-sided interval): what the portfolio judges each window on,
 * at a third of summaryCore's cost. Each bound is the `lowerBound`/`upperBound` summaryCore's intervals carry,
 * computed by the same functions (confidence-bounds.ts, fraction-bounds.ts), so the two give the same numbers.
 */
export interface SummaryBounds {
  overall: ReturnType<typeof indices>;
  tails: ReturnType<typeof normalTailFractions>;
  ppLower?: number;
  ppkLower?: number;
  /** Upper bound of the fraction out of specification, and the z-level at it. */
  fractionUpper?: number;
  zLevelLower?: number;
  within?: { sd: number; indices: ReturnType<typeof indices>; cpkLower?: number };
}

export function summaryBounds(...input: SummaryInput): SummaryBounds {
  return boundsOfSummary(input, true);
}

/**
 * The bounds a requirement on an index is judged on, alone: Ppk's and Cpk's lower bounds, without the bound on
 * Pp and those on the fraction out of specification and its z-level (two normal tails and a quantile per
 * window, which such a judgement never reads). The bounds given are summaryBounds' own.
 */
export function summaryIndexBounds(...input: SummaryInput): SummaryBounds {
  return boundsOfSummary(input, false);
}

function boundsOfSummary(
  [n, mu, sd, spec, level, sdWithin]: SummaryInput,
  withFraction: boolean
): SummaryBounds {
  const overall = indices(mu, sd, spec);
  const bounds: SummaryBounds = { overall, tails: normalTailFractions(mu, sd, spec) };
  if (withFraction && overall.spread !== undefined)
    bounds.ppLower = spreadIndexLowerBound(overall.spread, n, level);
  if (overall.k !== undefined && overall.k > 0) {
    bounds.ppkLower = bissellLowerBound(overall.k, n, level);
    if (withFraction) {
      bounds.fractionUpper = fractionUpperBound(bounds.ppkLower, bounds.ppLower);
      bounds.zLevelLower = normalUpperQuantile(bounds.fractionUpper);
    }
  }
  if (sdWithin !== undefined && sdWithin > 0) {
    const w = indices(mu, sdWithin, spec);
    bounds.within = { sd: sdWithin, indices: w };
    if (w.k !== undefined && w.k > 0) bounds.within.cpkLower = bissellLowerBound(w.k, n, level);
  }
  return bounds;
}

export function analyzeSummary(n: number, mu: number, sd: number, options: SummaryOptions): CapabilityResult {
  const spec = options.spec;
  checkSummary(n, mu, sd, spec);
  const level = options.confidence ?? 0.95;
  const assumptions = [
    'normal model',
    'summary only: normality and stability not checked',
    'overall sigma as reported (sample standard deviation, n − 1); no within sigma, so no Cp/Cpk'
  ];
  const warnings = new WarningList();
  const base: CapabilityResult = {
    kind: 'summary',
    n,
    mean: mu,
    sdOverall: sd,
    yield: 0,
    zLevel: 0,
    model: 'normal',
    modelLabel: `normal (mean ${mu}, sd ${sd}) from the reported summary`,
    method: 'normal model from the reported n, mean and standard deviation',
    assumptions,
    warnings: warnings.texts,
    warningCodes: warnings.codes,
    intervals: {}
  };
  if (sd === 0) {
    warnings.add(
      'no-spread',
      'The reported standard deviation is zero: no index or tail fraction can be computed'
    );
    const inside = (spec.lsl === undefined || mu >= spec.lsl) && (spec.usl === undefined || mu <= spec.usl);
    return { ...base, yield: inside ? 1 : 0, zLevel: inside ? Infinity : -Infinity };
  }
  const core = summaryCore(n, mu, sd, spec, level, options.sdWithin);
  const { overall, tails } = core;
  const result: CapabilityResult = {
    ...base,
    yield: 1 - tails.total,
    zLevel: tails.zLevel,
    ppmTotal: tails.total * 1e6
  };
  if (overall.spread !== undefined) result.pp = overall.spread;
  if (overall.lower !== undefined) result.ppl = overall.lower;
  if (overall.upper !== undefined) result.ppu = overall.upper;
  if (overall.k !== undefined) result.ppk = overall.k;
  const c = cpmIndex(mu, sd, spec);
  if (c !== undefined) result.cpm = c;
  if (tails.below !== undefined) result.ppmBelow = tails.below * 1e6;
  if (tails.above !== undefined) result.ppmAbove = tails.above * 1e6;
  if (tails.zMin !== undefined) result.zMin = tails.zMin;
  if (tails.zLower !== undefined) result.zLower = tails.zLower;
  if (tails.zUpper !== undefined) result.zUpper = tails.zUpper;
  if (core.pp) result.intervals.pp = core.pp;
  if (result.cpm !== undefined && spec.target !== undefined)
    result.intervals.cpm = cpmInterval(result.cpm, n, mu, sd, spec.target, level);
  if (core.ppk && core.fraction) {
    result.intervals.ppk = core.ppk;
    Object.assign(result.intervals, core.fraction);
  }
  if (n < 30)
    warnings.add(
      'small-sample',
      `Only ${n} values behind the summary: intervals are wide; 30 or more are advised`
    );
  if (core.within) {
    const within = core.within.indices;
    result.sdWithin = core.within.sd;
    if (within.spread !== undefined) {
      result.cp = within.spread;
      if (core.within.cp) result.intervals.cp = core.within.cp;
    }
    if (within.lower !== undefined) result.cpl = within.lower;
    if (within.upper !== undefined) result.cpu = within.upper;
    if (within.k !== undefined) {
      result.cpk = within.k;
      if (core.within.cpk) result.intervals.cpk = core.within.cpk;
    }
    assumptions[2] = `overall sigma from the merged summaries; ${options.sdWithinLabel ?? 'within sigma given'}`;
  }
  if (options.shortTermShift !== undefined) {
    result.zLevelShortTerm = result.zLevel + options.shortTermShift;
    assumptions.push(
      `short-term sigma level = z-level + ${options.shortTermShift} (shift convention), reported because it was asked for`
    );
  }
  if (options.requiredIndex !== undefined && result.ppk !== undefined && result.intervals.ppk) {
    const lb = result.intervals.ppk.lowerBound!;
    result.requirement = {
      index: 'ppk',
      threshold: options.requiredIndex,
      level,
      estimate: result.ppk,
      lowerBound: lb,
      shown: lb >= options.requiredIndex
    };
  }
  return result;
}
