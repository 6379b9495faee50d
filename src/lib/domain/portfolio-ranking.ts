import { normalCdf, normalSf, normalUpperQuantile } from '../stats/normal-distribution';
import { MomentsFold, summariseMoments } from '../stats/pooled-moments';
import { leastSquaresSlope } from '../stats/trend-slope';
import { windowFiguresOfStudy, type WindowFigures } from './window-figures';
import { RISK_CLASSES, type Characteristic, type RiskClass } from './characteristic';
import { profileFor, shortTermShift, zBasisOf, type ContextProfile } from './context-profile';
import { monthOrdinal, portfolioIndex } from './portfolio-index';
import { rankingPlan, type RankingPlan } from './ranking-plan';
import type { JudgeInput } from './judge-input';
import type { ImprovementProject } from './improvement-project';
import type { Process } from './process';
import { changeInForce, limitsFor, type Limits } from './specification-history';
import { CELL, periodOfOrdinal, statisticsOf, type MonthlyStatistics } from './monthly-statistics';
import type { Study, StudyData } from './study';
import { CountsFold, measuredWindowOf, windowData } from './window-study';
import { WindowFigureColumns, type JudgedFigures, type PerUnitFigures } from './window-figure-columns';

/**
 * The portfolio: every process judged against the level its industry context requires, on one comparable
 * scale, and ranked by a priority score whose formula is stated. Pure: the app, the command line and the
 * benchmark all call this one function.
 *
 * Comparable scale: every requirement is translated to a z-level — an index requirement k to z = 3k (the
 * nearer-limit distance, zMin = 3·Cpk), a ppm maximum to z = Q⁻¹(ppm/10⁶); a short-term context compares
 * short-term levels (z + 1.5) with its short-term requirement. The gap is z(estimate) − z(required): negative
 * means short. Counted data are judged per unit, as the row shows them: the share of defective units (for
 * defects, units with at least one defect, 1 − e^(−DPU)) — never the per-opportunity rate beside a per-unit
 * yield. Against an index requirement, counted data are compared through their z-level (required index × 3).
 *
 * The status follows from the figures shown beside it (STATUS_RULE).
 */
import {
  DEFAULT_WEIGHTS,
  STATUS_ORDER,
  type Badge,
  type CharacteristicRow,
  type CharacteristicStatus,
  type PortfolioRecords,
  type ProcessRow,
  type ProcessStanding,
  type ProcessTrend,
  type RankingOptions,
  type RankingOrder,
  type RankingWeights
} from './portfolio-terms';

export * from './portfolio-terms';
export type { JudgeInput } from './judge-input';

/**
 * A month's yield for the trend line, from the normal model of the month's mean and sd (counts exactly): the
 * trend shows direction, so it skips the model search that the window figures get.
 */
export function quickYield(study: Study, c: Characteristic): number | undefined {
  const d = study.data;
  if (d.kind === 'defectives' || d.kind === 'defects')
    return countedYield(d.kind, d.units, d.kind === 'defects' ? d.defects : d.defectives);
  if (d.kind === 'summary') return normalYield(d.mean, d.sd, limitsFor(c, study.period));
  if (d.values.length < 2) return undefined;
  const { mean, sd } = summariseMoments(d.values);
  return normalYield(mean, sd, limitsFor(c, study.period));
}

/** Counted yield per unit: 1 − defectives/units, or e^(−DPU) (units free of defects, Poisson). */
export function countedYield(kind: 'defectives' | 'defects', units: number, count: number): number {
  return kind === 'defectives' ? 1 - count / units : Math.exp(-count / units);
}

/** Normal-model yield inside the limits; undefined without spread. */
export function normalYield(mean: number, sd: number, limits: Limits): number | undefined {
  if (!(sd > 0)) return undefined;
  const below = limits.lsl !== undefined ? normalCdf((limits.lsl - mean) / sd) : 0;
  const above = limits.usl !== undefined ? normalSf((limits.usl - mean) / sd) : 0;
  return 1 - below - above;
}

const RISK_WEIGHT: Record<RiskClass, number> = { standard: 0, key: 1, safety: 2 };

/** ppm out of specification at each long-term z met so far (a handful of targets; a normal tail per process otherwise). */
const ppmOfLongTermZ = new Map<number, number>();

function ppmAtLongTermZ(z: number): number {
  let ppm = ppmOfLongTermZ.get(z);
  if (ppm === undefined) {
    if (ppmOfLongTermZ.size > 1000) ppmOfLongTermZ.clear();
    ppmOfLongTermZ.set(z, (ppm = normalSf(z) * 1e6));
  }
  return ppm;
}

/** The z of each ppm requirement met so far (a normal quantile, once per characteristic per ranking otherwise). */
const zOfPpmLevel = new Map<number, number>();

/** Required z (as reported) for a profile and risk class: the one definition of the required level. */
export function requiredZ(profile: ContextProfile, risk: RiskClass): number {
  const level = profile.levels[risk];
  const shift = shortTermShift(profile);
  switch (profile.measure) {
    case 'index':
      return 3 * level + shift;
    case 'zLevel':
      return level;
    case 'ppm': {
      let z = zOfPpmLevel.get(level);
      if (z === undefined) {
        if (zOfPpmLevel.size > 1000) zOfPpmLevel.clear();
        zOfPpmLevel.set(level, (z = normalUpperQuantile(Math.min(1, level / 1e6))));
      }
      return z + shift;
    }
  }
}

/**
 * A characteristic row's badges in the order rows list them: the figures' own (badgeMaskOf), then the shift
 * convention, then 'limits changed'. Each set of them is one frozen array, shared by every row and window that
 * has it (a handful of sets in a whole portfolio, where an array per characteristic and window was tens of MB).
 */
const ROW_BADGE_ORDER: readonly Badge[] = [
  'non-normal model',
  'summary only',
  'counted data',
  'not shown stable',
  'small sample',
  'shift convention',
  'limits changed'
];
const badgeBit = (b: Badge) => 1 << ROW_BADGE_ORDER.indexOf(b);
const SHIFT_BIT = badgeBit('shift convention');
const LIMITS_BIT = badgeBit('limits changed');
const badgeSets = new Map<number, Badge[]>();

function badgeSet(mask: number): Badge[] {
  let set = badgeSets.get(mask);
  if (!set) {
    set = Object.freeze(ROW_BADGE_ORDER.filter((_, i) => mask & (1 << i))) as Badge[];
    badgeSets.set(mask, set);
  }
  return set;
}

const NON_NORMAL_BIT = badgeBit('non-normal model');
const SUMMARY_BIT = badgeBit('summary only');
const COUNTED_BIT = badgeBit('counted data');
const UNSTABLE_BIT = badgeBit('not shown stable');
const SMALL_BIT = badgeBit('small sample');

/** The badges that follow from a window's figures alone. */
function badgeMaskOf(r: WindowFigures): number {
  let mask = 0;
  if (r.kind === 'measured' && r.model !== 'normal') mask |= NON_NORMAL_BIT;
  if (r.kind === 'summary') mask |= SUMMARY_BIT;
  if (r.kind === 'defectives' || r.kind === 'defects') mask |= COUNTED_BIT;
  if (r.stable === false) mask |= UNSTABLE_BIT;
  if (r.kind === 'measured' || r.kind === 'summary' ? r.n < 30 : r.n < 100) mask |= SMALL_BIT;
  return mask;
}

/**
 * The figures a characteristic is judged on, per unit as its row shows them, written into `out`: the long-term
 * z-level and its one-sided lower bound, and the fraction of units out of specification (defective) and its
 * one-sided upper bound. For defects, a unit is defective when it has at least one defect: 1 − e^(−DPU). Into an
 * object the caller keeps (a ranking reuses one): an object per window was garbage the size of the portfolio.
 */
function perUnitInto(result: WindowFigures, out: PerUnitFigures): PerUnitFigures {
  if (result.kind === 'defects') {
    const fraction = 1 - result.yield;
    const dpuBound = result.dpuUpper;
    const fractionBound = dpuBound === undefined ? undefined : 1 - Math.exp(-dpuBound);
    out.z = normalUpperQuantile(Math.min(1, Math.max(0, fraction)));
    out.fraction = fraction;
    out.fractionBound = fractionBound;
    out.zBound = fractionBound !== undefined ? normalUpperQuantile(Math.min(1, fractionBound)) : undefined;
    return out;
  }
  out.z = result.zLevel;
  out.fraction = result.ppmTotal !== undefined ? result.ppmTotal / 1e6 : 1 - result.yield;
  out.zBound = result.zLevelLower;
  out.fractionBound = result.fractionUpper;
  return out;
}

/** The one set of per-unit figures a ranking writes into (it is synchronous; whoever reads it copies what it keeps). */
const perUnitScratch: PerUnitFigures = { z: NaN, zBound: undefined, fraction: NaN, fractionBound: undefined };

/** The per-unit figures (perUnitInto) as an object of their own, without the bounds not known. */
export function perUnitFigures(result: WindowFigures): {
  z: number;
  zBound?: number;
  fraction: number;
  fractionBound?: number;
} {
  const { z, zBound, fraction, fractionBound } = perUnitInto(result, { ...perUnitScratch });
  return {
    z,
    fraction,
    ...(zBound !== undefined ? { zBound } : {}),
    ...(fractionBound !== undefined ? { fractionBound } : {})
  };
}

/**
 * A window's judging input (judge-input.ts), for a row to be built from: written as one literal with every field.
 */
function judgeInput(
  characteristic: Characteristic,
  result: WindowFigures | undefined,
  months: number,
  period?: string,
  limitsChanged = false
): JudgeInput {
  const unit = result ? perUnitInto(result, perUnitScratch) : undefined;
  return {
    characteristic,
    result,
    months,
    z: unit ? unit.z : NaN,
    zBound: unit?.zBound,
    fraction: unit ? unit.fraction : NaN,
    fractionBound: unit?.fractionBound,
    // Without changes the characteristic's own limits are in force: no copy per window.
    limits:
      period && characteristic.limitChanges?.length ? limitsFor(characteristic, period) : characteristic,
    limitsChanged,
    badgeMask: result ? badgeMaskOf(result) : 0
  };
}

/** Judges one characteristic's window result against its context's requirement (STATUS_RULE). */
export function judgeCharacteristic(
  characteristic: Characteristic,
  result: WindowFigures | undefined,
  profile: ContextProfile | undefined,
  months: number,
  period?: string
): CharacteristicRow {
  return judgePrepared(judgeInput(characteristic, result, months, period), profile);
}

/**
 * STATUS_RULE's comparison of a window's per-unit figures with its context's requirement: the estimate and bound in
 * the ruling measure's unit, whether each meets the level, and the z-levels the row shows. Written into one object
 * kept for the purpose (judging is synchronous): a full row copies what it shows, a bare status (the review's
 * trend quarters) reads two fields and keeps nothing.
 */
interface Verdict {
  estimate: number;
  /** The required level in the measure's unit (the profile's level for the risk class). */
  required: number;
  bound: number | undefined;
  meets: boolean;
  boundMeets: boolean;
  /** The estimate as a reported z-level (3 × index + shift where an index rules). */
  zEstimate: number;
  /** The per-unit z-level as the context reports it. */
  zReported: number;
  /** The required level as a reported z-level (requiredZ). */
  needZ: number;
  status: CharacteristicStatus;
}

const verdict: Verdict = {
  estimate: 0,
  required: 0,
  bound: undefined,
  meets: false,
  boundMeets: false,
  zEstimate: 0,
  zReported: 0,
  needZ: 0,
  status: 'no recent data'
};

function judgeFigures(
  result: JudgedFigures,
  unit: PerUnitFigures,
  risk: RiskClass,
  profile: ContextProfile
): Verdict {
  const required = profile.levels[risk];
  const shift = shortTermShift(profile);
  const zReported = unit.z + shift;
  const zBound = unit.zBound !== undefined ? unit.zBound + shift : undefined;
  const needZ = requiredZ(profile, risk);
  let estimate: number;
  let bound: number | undefined;
  let meets: boolean;
  let boundMeets = false;
  let zEstimate = zReported;
  switch (profile.measure) {
    case 'index': {
      const measured = result.kind === 'measured' || result.kind === 'summary';
      const idx = measured ? (result.cpk ?? result.ppk) : undefined;
      const idxBound = result.cpk !== undefined ? result.cpkLower : result.ppkLower;
      // Counted data have no index: they are judged on their z-level against 3 × the required index.
      estimate = idx ?? zReported;
      bound = idx !== undefined ? idxBound : zBound;
      const level = idx !== undefined ? required : needZ;
      meets = estimate >= level;
      boundMeets = bound !== undefined && bound >= level;
      if (idx !== undefined) zEstimate = 3 * idx + shift;
      break;
    }
    case 'zLevel':
      estimate = zReported;
      bound = zBound;
      meets = estimate >= required;
      boundMeets = bound !== undefined && bound >= required;
      break;
    case 'ppm': {
      estimate = unit.fraction * 1e6;
      bound = unit.fractionBound !== undefined ? unit.fractionBound * 1e6 : undefined;
      meets = estimate <= required;
      boundMeets = bound !== undefined && bound <= required;
      break;
    }
  }
  const v = verdict;
  v.estimate = estimate;
  v.required = required;
  v.bound = bound;
  v.meets = meets;
  v.boundMeets = boundMeets;
  v.zEstimate = zEstimate;
  v.zReported = zReported;
  v.needZ = needZ;
  v.status = !meets ? 'short' : boundMeets && result.stable !== false ? 'meets, shown' : 'meets, not shown';
  return v;
}

/**
 * Judges a prepared window. `badges`, when given, are the row's badges as the caller keeps them for this kind
 * of profile (see rowBadges), shared between rankings; otherwise they are built here.
 */
function judgePrepared(
  input: JudgeInput,
  profile: ContextProfile | undefined,
  badges?: Badge[]
): CharacteristicRow {
  const { characteristic, result, months } = input;
  const risk = characteristic.riskClass;
  const required = profile ? profile.levels[risk] : NaN;
  if (!result || !profile)
    return {
      characteristic,
      status: 'no recent data',
      required,
      badges: badges ?? [],
      months,
      ...(result ? { result } : {})
    };
  const shift = shortTermShift(profile);
  const { estimate, bound, status, zEstimate, zReported, needZ } = judgeFigures(result, input, risk, profile);
  badges ??= badgeSet(input.badgeMask | (profile.reporting === 'short-term' ? SHIFT_BIT : 0));
  // One literal with every field (see rankPortfolio).
  const { lsl, usl } = input.limits;
  const sdNow = result.sdWithin ?? result.sdOverall;
  let centring: CharacteristicRow['centring'];
  // Centring or spread, for measured data with both limits, judged against the requirement as an index.
  if (lsl !== undefined && usl !== undefined && sdNow !== undefined && sdNow > 0) {
    const requiredIndex = (needZ - shift) / 3;
    const centredIndex = (usl - lsl) / (6 * sdNow);
    centring = {
      centredIndex,
      sdNow,
      sdNeeded: (usl - lsl) / (6 * requiredIndex),
      centringMeets: centredIndex >= requiredIndex
    };
  }
  const row: CharacteristicRow = {
    characteristic,
    status,
    result,
    estimate,
    bound,
    required,
    requiredZ: needZ,
    zShown: zReported,
    zGap: zEstimate - needZ,
    centring,
    badges,
    months
  };
  return row;
}

/** Cost of poor quality per year: fraction defective × monthly volume × 12 × cost per defective unit. */
export function costPerYear(
  fraction: number,
  process: Pick<Process, 'monthlyVolume' | 'costPerDefective'>
): number {
  return fraction * process.monthlyVolume * 12 * process.costPerDefective;
}

/** Position of each status in STATUS_ORDER (worst first). */
const STATUS_RANK = Object.fromEntries(STATUS_ORDER.map((s, i) => [s, i])) as Record<
  CharacteristicStatus,
  number
>;

/**
 * Arrays kept with the prepared windows are shared by the rows of every ranking that judges them, so they are
 * frozen: a change to one row's badges or trend would otherwise show in every other.
 *
 * A characteristic row's badges, as judgePrepared builds them (the figures' own, then the shift convention for a
 * short-term context; none without figures or a profile), then 'limits changed'.
 */
function rowBadges(w: JudgeInput, profile: ContextProfile | undefined): Badge[] {
  const limits = w.limitsChanged ? LIMITS_BIT : 0;
  if (!profile || !w.result) return badgeSet(limits);
  return badgeSet(w.badgeMask | limits | (profile.reporting === 'short-term' ? SHIFT_BIT : 0));
}

/** How the judged rows' badges vary with the profile: none without one, else with or without the shift. */
type BadgeVariant = 'none' | 'long-term' | 'short-term';

/**
 * What a process's full row is built from (processRowOf), made when a row is asked for (preparedProcessAt): its
 * characteristics' windows as objects (from the window's columns) and its monthly trend as long-term z-levels
 * (the context's shift is added when judged).
 */
interface PreparedProcess {
  characteristics: JudgeInput[];
  trend: (number | undefined)[];
  /** Slope of the trend (the same with the context's shift added to every month). */
  trendSlope: number | undefined;
  /** The trend with a context's shift added, for the last shift asked for (shiftedTrend). */
  shifted: { shift: number; trend: (number | undefined)[] } | undefined;
  /** The characteristic rows (judgePrepared) under the profile with this key, built when a full row is asked for. */
  rowsKey: string | undefined;
  rows: CharacteristicRow[];
}

/**
 * What judging a process reads of its context's profile — the measure, the levels, the reporting (and the
 * confidence, should it come to be read) — as one string: two profiles with the same key judge every
 * characteristic alike, so a change of weights or order, or of another context's target, re-judges nothing.
 */
function judgingKeyOf(profile: ContextProfile | undefined): string {
  if (!profile) return '';
  const { measure, levels, reporting, confidence } = profile;
  return `${measure}|${reporting}|${confidence}|${levels.standard}|${levels.key}|${levels.safety}`;
}

/**
 * The trend as a context reports it (its shift added to every month), shared by the rankings that show it. One
 * shifted copy is kept (contexts report long-term, shift 0, or with the 1.5σ convention): a map per process and
 * window cost more memory than the trends it held.
 */
function shiftedTrend(p: PreparedProcess, shift: number): (number | undefined)[] {
  // No trend computed (`trendMonths: 0`, as the portfolio's worker ranks): nothing to shift.
  if (shift === 0 || p.trend.length === 0) return p.trend;
  if (p.shifted?.shift !== shift) {
    const trend = p.trend.map((z) => (z === undefined ? undefined : z + shift));
    p.shifted = { shift, trend: Object.freeze(trend) as (number | undefined)[] };
  }
  return p.shifted.trend;
}

/** 'incomplete' as a bit after ROW_BADGE_ORDER's. */
const INCOMPLETE_BIT = 1 << ROW_BADGE_ORDER.length;

/**
 * A process's badges under a badge variant: every badge of its rows with window figures, in the rows' order
 * (ROW_BADGE_ORDER; the figures' own only where a profile judges them, the shift convention where it reports
 * short-term), then 'incomplete' where some characteristic has none. From the masks fillProcess kept, and
 * interned by the resulting mask: a portfolio has a handful of different lists (an array per process was one
 * more object each, and a set per process the first time a twentieth of a first ranking).
 */
function processBadges(window: PreparedWindow, p: number, variant: BadgeVariant): Badge[] {
  let mask = window.otherBadges[p]!;
  if (variant !== 'none') mask |= window.figureBadges[p]!;
  if (variant === 'short-term' && window.withData[p]! > 0) mask |= SHIFT_BIT;
  let list = processBadgeLists[mask];
  if (!list) {
    const badges: Badge[] = [...badgeSet(mask & ~INCOMPLETE_BIT)];
    if (mask & INCOMPLETE_BIT) badges.push('incomplete');
    processBadgeLists[mask] = list = Object.freeze(badges) as Badge[];
  }
  return list;
}

/** Every list of process badges met so far, by its mask (frozen and shared, as badgeSet's). */
const processBadgeLists: (Badge[] | undefined)[] = [];

/**
 * A window prepared for every process of a plan: its characteristics' windows in `columns` (by their rows in the
 * read model `model`), and, in typed arrays by plan position, what a ranking reads of each process — whether it
 * has been filled from the columns (fillProcess), its risk class (RISK_CLASSES position), the number of its
 * characteristics with window figures, the product of their yields and its long-term z-level, the badge masks of
 * its rows (processBadges), and how it was last judged (judgeProcess) under a profile with the judging key
 * `judgedKey[p]` (judgingKeyOf): its status (STATUS_ORDER position; the worst of its characteristics'), its
 * weakest characteristic (smallest gap; an index into its characteristics, −1 for none) with that one's gap
 * (Infinity without a profile), estimate, bound, required level and its z, Cpk and Ppk (NaN where not known), and
 * whether any characteristic with data is not shown to meet its target. In arrays, not in an object per process:
 * a recompute after a target change judges every process again, and the list reads them all in ranked order, a
 * shuffle of the order objects would lie in memory (at company size, a cache miss per field read). A process's
 * objects (`processes`) are made only when its row is asked for.
 */
interface PreparedWindow {
  model: MonthlyStatistics;
  columns: WindowFigureColumns;
  endPeriod: string;
  months: RankingMonths;
  processes: (PreparedProcess | undefined)[];
  filled: Uint8Array;
  risk: Uint8Array;
  withData: Int32Array;
  yield: Float64Array;
  zLevel: Float64Array;
  figureBadges: Int32Array;
  otherBadges: Int32Array;
  judgedKey: (string | undefined)[];
  status: Uint8Array;
  weakest: Int32Array;
  gap: Float64Array;
  estimate: Float64Array;
  bound: Float64Array;
  required: Float64Array;
  requiredZ: Float64Array;
  cpk: Float64Array;
  ppk: Float64Array;
  notShown: Uint8Array;
}

/** How a ranked portfolio's processes were judged, by plan position (PreparedWindow's arrays), read only. */
export type JudgedColumns = Readonly<
  Pick<
    PreparedWindow,
    | 'risk'
    | 'yield'
    | 'zLevel'
    | 'status'
    | 'weakest'
    | 'gap'
    | 'estimate'
    | 'bound'
    | 'required'
    | 'requiredZ'
    | 'cpk'
    | 'ppk'
    | 'notShown'
  >
>;

/** The months of a ranking: its window's first and last, and those of its trend line. */
interface RankingMonths {
  end: number;
  firstMonth: number;
  trendFirstMonth: number;
  trendMonths: number;
}

function preparedWindowOf(
  count: number,
  model: MonthlyStatistics,
  columns: WindowFigureColumns,
  endPeriod: string,
  months: RankingMonths
): PreparedWindow {
  return {
    model,
    columns,
    endPeriod,
    months,
    processes: new Array<PreparedProcess | undefined>(count),
    filled: new Uint8Array(count),
    risk: new Uint8Array(count),
    withData: new Int32Array(count),
    yield: new Float64Array(count),
    zLevel: new Float64Array(count),
    figureBadges: new Int32Array(count),
    otherBadges: new Int32Array(count),
    judgedKey: new Array<string | undefined>(count),
    status: new Uint8Array(count),
    weakest: new Int32Array(count),
    gap: new Float64Array(count),
    estimate: new Float64Array(count),
    bound: new Float64Array(count),
    required: new Float64Array(count),
    requiredZ: new Float64Array(count),
    cpk: new Float64Array(count),
    ppk: new Float64Array(count),
    notShown: new Uint8Array(count)
  };
}

/**
 * Prepared windows per ranking plan and window: a change of target, weight or order re-judges these without
 * looking at a study again. A new plan (a study written changes the model's version; new record arrays) starts
 * them again; the window's columns, kept by the figures cache, are found again by every plan of the same model.
 */
const preparedWindows = new WeakMap<RankingPlan, Map<string, PreparedWindow>>();

const PREPARED_WINDOWS = 4;

/** The prepared window of a full ranking's window, kept for the last few asked for. */
function preparedFor(
  plan: RankingPlan,
  model: MonthlyStatistics,
  options: RankingOptions,
  months: RankingMonths
): PreparedWindow {
  const window = `${options.endPeriod}|${options.windowMonths}|${options.trendMonths ?? 12}`;
  let byWindow = preparedWindows.get(plan);
  if (!byWindow) preparedWindows.set(plan, (byWindow = new Map()));
  let prepared = byWindow.get(window);
  if (!prepared) {
    // The windows of the last few requests only: the review ranks ten quarters, and keeping every one of them
    // prepared cost hundreds of megabytes at company size; the window figures cache keeps the figures anyway.
    if (byWindow.size >= PREPARED_WINDOWS) byWindow.delete(byWindow.keys().next().value!);
    const columns =
      options.cache?.columns(model, months.firstMonth, months.end) ??
      new WindowFigureColumns(months.firstMonth, months.end);
    columns.ensure(model.rowStamp.length);
    prepared = preparedWindowOf(plan.processes.length, model, columns, options.endPeriod, months);
    byWindow.set(window, prepared);
  }
  return prepared;
}

const scratch = { monthly: new Float64Array(36), count: new Int32Array(36) };

/** The trend of a ranking asked for none (`trendMonths: 0`), shared by all its processes. */
const NO_TREND = Object.freeze([]) as unknown as (number | undefined)[];

/**
 * A process's monthly trend as long-term z-levels: per month, the z of the product of its characteristics'
 * quick yields (quickYield), where every characteristic has one. Frozen: it is shared by the rows that show it.
 * `rows[at + i]` is the read-model row of `chars[i]` (−1 for none), as RankingPlan holds them.
 */
function monthlyTrend(
  chars: readonly Characteristic[],
  rows: ArrayLike<number>,
  at: number,
  model: MonthlyStatistics,
  months: { end: number; trendFirstMonth: number; trendMonths: number }
): (number | undefined)[] {
  if (months.trendMonths === 0) return NO_TREND;
  // Scratch arrays shared by every call (a ranking is synchronous): two small typed arrays per process were a
  // measurable share of a company-size ranking.
  if (scratch.monthly.length < months.trendMonths) {
    scratch.monthly = new Float64Array(months.trendMonths);
    scratch.count = new Int32Array(months.trendMonths);
  }
  const monthly = scratch.monthly.fill(1, 0, months.trendMonths); // product of the month's yields
  const monthlyCount = scratch.count.fill(0, 0, months.trendMonths);
  for (let i = 0; i < chars.length; i += 1) {
    const row = rows[at + i]!;
    if (row < 0) continue;
    const c = chars[i]!;
    const fixedLimits = c.limitChanges?.length ? undefined : c;
    for (let m = months.trendFirstMonth; m <= months.end; m += 1) {
      const cell = model.cellOf(row, m);
      if (cell < 0 || model.kind[cell] === CELL.empty) continue;
      const t = m - months.trendFirstMonth;
      const y = cellQuickYield(model, cell, m, c, fixedLimits);
      if (y === undefined) continue;
      monthly[t]! *= y;
      monthlyCount[t]! += 1;
    }
  }
  // Sized, not pushed: it is kept with the prepared window, and push leaves room for 17 months.
  const trend = new Array<number | undefined>(months.trendMonths);
  for (let m = 0; m < months.trendMonths; m += 1) {
    const count = monthlyCount[m]!;
    trend[m] =
      count > 0 && count === chars.length ? normalUpperQuantile(Math.min(1, 1 - monthly[m]!)) : undefined;
  }
  return Object.freeze(trend) as (number | undefined)[];
}

/**
 * Computes a characteristic's window (WINDOW_RULE's months, pooled or analysed: figuresOfCells) into its row of
 * the window's columns, under the key it was computed from: the characteristic's revision and the row's stamp.
 */
function computeWindow(window: PreparedWindow, row: number, c: Characteristic): void {
  const { model, columns, months, endPeriod } = window;
  const cells = windowCellsScratch;
  const limitsChanged = windowCells(model, row, c, months, endPeriod, cells);
  const { result, months: counted } = figuresOfCells(model, cells, c, endPeriod);
  columns.write(
    row,
    c.rev,
    model.rowStamp[row]!,
    result,
    counted,
    limitsChanged,
    result ? perUnitInto(result, perUnitScratch) : undefined,
    result ? badgeMaskOf(result) : 0
  );
}

/**
 * Fills position p of a prepared window: each of the process's characteristics' windows, computed into the
 * columns unless they hold it for this revision and row stamp (kept from an earlier ranking, of this record set or
 * another of the same model), and what a ranking reads of the process — its risk class, how many characteristics
 * have window figures, the product of their yields and its z-level, and its badge masks. A loop over typed
 * arrays: no object is made or kept per window or process.
 */
function fillProcess(window: PreparedWindow, plan: RankingPlan, p: number): void {
  const chars = plan.characteristics[p]!;
  const at = plan.start[p]!;
  const { model, columns } = window;
  let withData = 0;
  let y = 1;
  let figureBadges = 0;
  let otherBadges = 0;
  let risk: RiskClass = 'standard';
  for (let i = 0; i < chars.length; i += 1) {
    const c = chars[i]!;
    if (c.riskClass === 'safety') risk = 'safety';
    else if (c.riskClass === 'key' && risk === 'standard') risk = 'key';
    const row = plan.rows[at + i]!;
    if (row < 0) continue;
    if (!columns.holds(row, c.rev, model.rowStamp[row]!)) computeWindow(window, row, c);
    if (!columns.hasFigures(row)) continue;
    withData += 1;
    y *= columns.yieldAt(row);
    figureBadges |= columns.badgeMaskAt(row);
    if (columns.limitsChangedAt(row)) otherBadges |= LIMITS_BIT;
  }
  if (withData && withData < chars.length) otherBadges |= INCOMPLETE_BIT;
  window.risk[p] = RISK_CLASSES.indexOf(risk);
  window.withData[p] = withData;
  window.yield[p] = y;
  window.zLevel[p] = normalUpperQuantile(Math.min(1, 1 - y));
  window.figureBadges[p] = figureBadges;
  window.otherBadges[p] = otherBadges;
  window.filled[p] = 1;
}

/**
 * Whether every window of process p the columns hold is still the one its characteristics and studies give: the
 * columns are shared by every plan of the model (the figures cache), so a ranking of another record set — where a
 * characteristic has another revision — may have computed a row again since p was filled.
 */
function processCurrent(window: PreparedWindow, plan: RankingPlan, p: number): boolean {
  const chars = plan.characteristics[p]!;
  const at = plan.start[p]!;
  const { model, columns } = window;
  for (let i = 0; i < chars.length; i += 1) {
    const row = plan.rows[at + i]!;
    if (row >= 0 && !columns.holds(row, chars[i]!.rev, model.rowStamp[row]!)) return false;
  }
  return true;
}

/** Fills position p again (fillProcess) and forgets its objects, made from what the columns held before. */
function refillProcess(window: PreparedWindow, plan: RankingPlan, p: number): void {
  window.processes[p] = undefined;
  fillProcess(window, plan, p);
}

/**
 * Process p's objects for its full row (PreparedProcess), made the first time they are asked for: its
 * characteristics' windows as judging inputs built from the columns (the figures as computed, read back), and
 * its monthly trend.
 */
function preparedProcessAt(window: PreparedWindow, plan: RankingPlan, p: number): PreparedProcess {
  let prepared = window.processes[p];
  if (prepared) return prepared;
  const chars = plan.characteristics[p]!;
  const at = plan.start[p]!;
  const { columns, endPeriod, months } = window;
  // A loop, not a map: a closure per process was one more object each, and a call per characteristic.
  const inputs = new Array<JudgeInput>(chars.length);
  for (let i = 0; i < chars.length; i += 1) {
    const c = chars[i]!;
    const row = plan.rows[at + i]!;
    inputs[i] =
      row < 0
        ? judgeInput(c, undefined, 0, endPeriod)
        : judgeInput(
            c,
            columns.figuresAt(row),
            columns.monthsAt(row),
            endPeriod,
            columns.limitsChangedAt(row)
          );
  }
  const trend = monthlyTrend(chars, plan.rows, at, window.model, months);
  prepared = {
    characteristics: inputs,
    trend,
    trendSlope: leastSquaresSlope(trend),
    shifted: undefined,
    rowsKey: undefined,
    rows: NO_ROWS
  };
  window.processes[p] = prepared;
  return prepared;
}

/** The rows of a process not judged yet (shared, frozen). */
const NO_ROWS = Object.freeze([]) as unknown as CharacteristicRow[];

/**
 * The cells of a characteristic's window that count (WINDOW_RULE: the months under the limits in force in its
 * last month), written into `cells` (emptied first), and whether earlier months of the window were left out for
 * that reason. The callers pass windowCellsScratch: an array per window was garbage the size of the portfolio.
 */
function windowCells(
  model: MonthlyStatistics,
  row: number,
  c: Characteristic,
  months: { firstMonth: number; end: number },
  endPeriod: string,
  cells: number[]
): boolean {
  const since = c.limitChanges?.length ? changeInForce(c, endPeriod)?.from : undefined;
  const from = since === undefined ? months.firstMonth : Math.max(months.firstMonth, monthOrdinal(since));
  let limitsChanged = false;
  for (let m = months.firstMonth; m < from; m += 1) {
    const cell = model.cellOf(row, m);
    if (cell >= 0 && model.kind[cell] !== CELL.empty) limitsChanged = true;
  }
  cells.length = 0;
  for (let m = from; m <= months.end; m += 1) {
    const cell = model.cellOf(row, m);
    if (cell >= 0 && model.kind[cell] !== CELL.empty) cells.push(cell);
  }
  return limitsChanged;
}

/** The one array windowCells writes into: read at once by its caller (a ranking is synchronous), never kept. */
const windowCellsScratch: number[] = [];

/**
 * A window's figures from its cells (none where its months cannot be pooled or analysed), and its months.
 * `bounds` as windowFiguresOfStudy takes it.
 */
function figuresOfCells(
  model: MonthlyStatistics,
  cells: readonly number[],
  c: Characteristic,
  endPeriod: string,
  bounds: 'all' | 'index' = 'all'
): { result: WindowFigures | undefined; months: number } {
  const pooled = pooledWindow(model, cells);
  const raw = pooled ? undefined : rawWindow(model, cells);
  const w = pooled ?? raw;
  let result: WindowFigures | undefined;
  if (w) {
    try {
      result = windowFiguresOfStudy({ data: w.data, period: endPeriod }, c, w.sdWithin, bounds);
    } catch {
      result = undefined;
    }
  }
  // A pooled window counts each of its cells as a month; a raw one, the months windowData analysed.
  return { result, months: pooled ? cells.length : raw ? raw.months : 0 };
}

/**
 * A process judged as judgeProcess and rankPortfolio judge it, without rows, badges, a trend or anything kept:
 * its status (the worst of its characteristics'), the product of the yields of those with window figures and
 * how many they are. What a quarter of the review's trend and its year-ago headline need.
 */
function standingOfProcess(
  chars: readonly Characteristic[],
  rows: ArrayLike<number>,
  at: number,
  model: MonthlyStatistics,
  options: RankingOptions,
  months: { firstMonth: number; end: number },
  profile: ContextProfile | undefined
): { status: CharacteristicStatus; yield: number; withData: number } {
  let status: CharacteristicStatus = 'no recent data';
  let y = 1;
  let withData = 0;
  // Judged against an index, a window's fraction and z-level bounds are never read (judgeFigures): left out.
  const bounds = profile?.measure === 'index' ? 'index' : 'all';
  for (let i = 0; i < chars.length; i += 1) {
    const row = rows[at + i]!;
    if (row < 0) continue;
    const c = chars[i]!;
    windowCells(model, row, c, months, options.endPeriod, windowCellsScratch);
    const { result } = figuresOfCells(model, windowCellsScratch, c, options.endPeriod, bounds);
    if (!result) continue;
    withData += 1;
    y *= result.yield;
    if (!profile) continue;
    const s = judgeFigures(result, perUnitInto(result, perUnitScratch), c.riskClass, profile).status;
    if (STATUS_RANK[s] < STATUS_RANK[status]) status = s;
  }
  return { status, yield: y, withData };
}

/** A window of raw months, from their studies' values (windowData: model search, subgroups, stability). */
function rawWindow(model: MonthlyStatistics, cells: readonly number[]) {
  const studies = cells.map((cell) => model.studyAt(cell)).filter((s): s is Study => s !== undefined);
  const w = studies.length === cells.length ? windowData(studies) : undefined;
  return w && { ...w, months: w.months.length };
}

/** A month's quick yield (quickYield) from its cell of the read model. */
function cellQuickYield(
  model: MonthlyStatistics,
  cell: number,
  month: number,
  c: Characteristic,
  fixedLimits: Limits | undefined
): number | undefined {
  const kind = model.kind[cell];
  if (kind === CELL.defectives || kind === CELL.defects)
    return countedYield(
      kind === CELL.defects ? 'defects' : 'defectives',
      model.units[cell]!,
      model.count[cell]!
    );
  if (kind === CELL.raw && model.n[cell]! < 2) return undefined;
  const limits = fixedLimits ?? limitsFor(c, periodOfOrdinal(month));
  return normalYield(model.mean[cell]!, model.sd[cell]!, limits);
}

const measuredFold = new MomentsFold();
const countsFold = new CountsFold();

/**
 * A window pooled from the read model's cells, by the rules of windowData (window-study.ts) — or undefined when
 * all months are raw (analysed from their values, rawWindow) or their kinds cannot be pooled together (windowData
 * gives them no data either).
 */
function pooledWindow(
  model: MonthlyStatistics,
  cells: readonly number[]
): { data: StudyData; sdWithin?: number } | undefined {
  if (cells.length === 0) return undefined;
  let raw = 0;
  let measured = 0;
  let defectives = 0;
  let defects = 0;
  for (const cell of cells) {
    const k = model.kind[cell];
    if (k === CELL.raw) raw += 1;
    if (k === CELL.raw || k === CELL.summary) measured += 1;
    else if (k === CELL.defectives) defectives += 1;
    else if (k === CELL.defects) defects += 1;
  }
  const months = cells.length;
  if (raw === months) return undefined;
  if (measured === months) {
    // Pooled as poolMeasuredMonths pools, from the cells themselves (one fold reused: a ranking is synchronous).
    const fold = measuredFold.reset();
    for (const cell of cells) fold.add(model.n[cell]!, model.mean[cell]!, model.sd[cell]!);
    return measuredWindowOf(fold);
  }
  if (defectives === months || defects === months) {
    // Pooled as poolDefectiveMonths and poolDefectMonths pool, from the cells themselves (one fold reused).
    const fold = countsFold.reset();
    for (const cell of cells) fold.add(model.units[cell]!, model.count[cell]!, model.opportunities[cell]!);
    return { data: defects === months ? fold.defects() : fold.defectives() };
  }
  return undefined;
}

/** What every pass over the portfolio needs: the months and the read model. */
function rankingContext(records: PortfolioRecords, options: RankingOptions) {
  const trendMonths = options.trendMonths ?? 12;
  const end = monthOrdinal(options.endPeriod);
  const months: RankingMonths = {
    end,
    firstMonth: end - (options.windowMonths - 1),
    trendFirstMonth: end - (trendMonths - 1),
    trendMonths
  };
  return { months, model: statisticsOf(records) };
}

/** The figures judging reads of a window, read from its columns (judgeProcess; a ranking is synchronous). */
const judgedScratch: JudgedFigures = {
  kind: 'summary',
  cpk: undefined,
  ppk: undefined,
  cpkLower: undefined,
  ppkLower: undefined,
  stable: undefined
};

/**
 * A process's characteristics judged under a profile with this judging key, into position p of the window's
 * judged arrays: as judgePrepared judges each (STATUS_RULE), without building its row.
 */
function judgeProcess(
  window: PreparedWindow,
  plan: RankingPlan,
  p: number,
  profile: ContextProfile | undefined,
  key: string
): void {
  let status: CharacteristicStatus = 'no recent data';
  let weakest = -1;
  let gap = Infinity;
  let notShown = 0;
  window.estimate[p] = window.bound[p] = window.required[p] = window.requiredZ[p] = NaN;
  window.cpk[p] = window.ppk[p] = NaN;
  const chars = plan.characteristics[p]!;
  const at = plan.start[p]!;
  const columns = window.columns;
  for (let i = 0; i < chars.length; i += 1) {
    const row = plan.rows[at + i]!;
    if (row < 0 || !columns.hasFigures(row)) continue;
    if (!profile) {
      // Figures without a profile: the row shows them, unjudged ('no recent data', no gap).
      if (weakest < 0) {
        weakest = i;
        window.cpk[p] = columns.numberAt(row, 'cpk');
        window.ppk[p] = columns.numberAt(row, 'ppk');
      }
      notShown = 1;
      continue;
    }
    // The figures as the row would have them: the object itself where the columns could not carry a NaN of its own.
    const kept = columns.keptAt(row);
    const figures: JudgedFigures = kept ?? judgedScratch;
    if (kept) perUnitInto(kept, perUnitScratch);
    else columns.readJudged(row, judgedScratch, perUnitScratch);
    const v = judgeFigures(figures, perUnitScratch, chars[i]!.riskClass, profile);
    if (STATUS_RANK[v.status] < STATUS_RANK[status]) status = v.status;
    const zGap = v.zEstimate - v.needZ;
    // The smallest gap; the first of equal ones (a NaN gap never replaces one, as the rows compared them).
    if (weakest < 0 || zGap < gap) {
      weakest = i;
      gap = zGap;
      window.estimate[p] = v.estimate;
      window.bound[p] = v.bound ?? NaN;
      window.required[p] = v.required;
      window.requiredZ[p] = v.needZ;
      window.cpk[p] = figures.cpk ?? NaN;
      window.ppk[p] = figures.ppk ?? NaN;
    }
    if (v.status !== 'meets, shown') notShown = 1;
  }
  window.judgedKey[p] = key;
  window.status[p] = STATUS_RANK[status];
  window.weakest[p] = weakest;
  window.gap[p] = gap;
  window.notShown[p] = notShown;
}

/** The process's characteristic rows under a profile with this judging key, built once per key (frozen, shared). */
function rowsOf(
  windows: PreparedProcess,
  profile: ContextProfile | undefined,
  key: string
): CharacteristicRow[] {
  if (windows.rowsKey !== key) {
    // Mapped, not pushed: an array grown by push keeps room for 17 rows.
    windows.rows = Object.freeze(
      windows.characteristics.map((w) => judgePrepared(w, profile, rowBadges(w, profile)))
    ) as CharacteristicRow[];
    windows.rowsKey = key;
  }
  return windows.rows;
}

/**
 * Each live process judged without a row (standingOfProcess), in the records' order: its status, and the cost
 * and the 'incomplete' mark its row would show — what a quarter of the review's trend and its year-ago headline
 * need. The same judging as rankPortfolio's, without building, badging and sorting rows (ten quarters of full
 * rows were most of the review's time and memory at company size).
 */
export function portfolioStandings(
  records: PortfolioRecords,
  profiles: readonly ContextProfile[],
  options: RankingOptions
): ProcessStanding[] {
  // No window is kept: eight quarters of every process's windows held for the review's trend cost more (their
  // garbage, the heap they grew, and the full rankings' prepared windows they pushed out) than computing them
  // again. What is kept is the judging itself, three numbers per process and quarter (judgedStandings): stepping
  // to the next quarter, or changing the reporting currency, judges again only the quarters not seen.
  const { months, model } = rankingContext(records, options);
  const plan = rankingPlan(records, model);
  const judged = judgedStandings(plan, profiles, options, () => {
    const count = plan.processes.length;
    const out = {
      status: new Uint8Array(count),
      yield: new Float64Array(count),
      withData: new Int32Array(count)
    };
    for (let p = 0; p < count; p += 1) {
      const profile = profileFor(profiles, plan.processes[p]!.contextId);
      const s = standingOfProcess(
        plan.characteristics[p]!,
        plan.rows,
        plan.start[p]!,
        model,
        options,
        months,
        profile
      );
      out.status[p] = STATUS_RANK[s.status];
      out.yield[p] = s.yield;
      out.withData[p] = s.withData;
    }
    return out;
  });
  const standings = new Array<ProcessStanding>(plan.processes.length);
  for (let p = 0; p < plan.processes.length; p += 1) {
    const process = plan.processes[p]!;
    const withData = judged.withData[p]!;
    // As rankPortfolio: a cost where some characteristic has figures; incomplete where not all of them have.
    standings[p] = {
      process,
      status: STATUS_ORDER[judged.status[p]!]!,
      costPerYear: withData ? costPerYear(1 - judged.yield[p]!, process) : undefined,
      incomplete: withData > 0 && withData < plan.characteristics[p]!.length
    };
  }
  return standings;
}

/** Each process of a plan as standingOfProcess judged it for one window: status (its STATUS_ORDER position), yield, count. */
interface JudgedStandings {
  status: Uint8Array;
  yield: Float64Array;
  withData: Int32Array;
}

/** Standings kept per plan (a new plan — records or studies changed — starts afresh), for the last few windows. */
const standingsByPlan = new WeakMap<RankingPlan, Map<string, JudgedStandings>>();
const STANDINGS_KEPT = 12;

/**
 * The standings of a window under these profiles, judged by `judge` the first time. Found by the window and by
 * what judging reads of every profile (judgingKeyOf): a change of weights or order, which standings never read,
 * finds them; a change of target does not.
 */
function judgedStandings(
  plan: RankingPlan,
  profiles: readonly ContextProfile[],
  options: RankingOptions,
  judge: () => JudgedStandings
): JudgedStandings {
  let kept = standingsByPlan.get(plan);
  if (!kept) standingsByPlan.set(plan, (kept = new Map()));
  const key = `${options.endPeriod}|${options.windowMonths}|${profiles.map((p) => `${p.id}=${judgingKeyOf(p)}`).join(';')}`;
  let standings = kept.get(key);
  if (!standings) {
    if (kept.size >= STANDINGS_KEPT) kept.delete(kept.keys().next().value!);
    kept.set(key, (standings = judge()));
  }
  return standings;
}

/** A ranked row's standing, as portfolioStandings gives it without the row. */
export function standingOfRow(row: ProcessRow): ProcessStanding {
  return {
    process: row.process,
    status: row.status,
    costPerYear: row.costPerYear,
    incomplete: row.badges.includes('incomplete')
  };
}

/**
 * The monthly trend lines of the given processes as their contexts report them — what rankPortfolio puts in
 * each row, computed for these processes alone. The portfolio's page ranks without trends (`trendMonths: 0`) and
 * asks for the lines of the rows on screen: a line is twelve months of every characteristic, twelve times the
 * normal tails and quantiles of the ranking itself, a third of a company-size ranking for rows mostly never seen.
 */
export function processTrends(
  records: PortfolioRecords,
  profiles: readonly ContextProfile[],
  processIds: Iterable<string>,
  options: Pick<RankingOptions, 'endPeriod' | 'trendMonths'>
): Map<string, ProcessTrend> {
  const { months, model } = rankingContext(records, { ...options, windowMonths: 1 });
  const index = portfolioIndex(records);
  const asked = new Set(processIds);
  const trends = new Map<string, ProcessTrend>();
  for (const process of records.processes) {
    if (!asked.has(process.id)) continue;
    const chars = index.characteristics.get(process.id) ?? [];
    const rows = chars.map((c) => model.rowOf(c.id) ?? -1);
    const trend = monthlyTrend(chars, rows, 0, model, months);
    const shift = shortTermShift(profileFor(profiles, process.contextId));
    trends.set(process.id, {
      trend: shift === 0 ? trend : trend.map((z) => (z === undefined ? undefined : z + shift)),
      trendSlope: leastSquaresSlope(trend)
    });
  }
  return trends;
}

/** The rows with their trend lines (processTrends) in place of none: copies, the given rows stay as they are. */
export function withTrends(
  records: PortfolioRecords,
  profiles: readonly ContextProfile[],
  rows: readonly ProcessRow[],
  options: Pick<RankingOptions, 'endPeriod' | 'trendMonths'>
): ProcessRow[] {
  const trends = processTrends(
    records,
    profiles,
    rows.map((r) => r.process.id),
    options
  );
  return rows.map((r) => {
    const t = trends.get(r.process.id);
    return t ? { ...r, trend: t.trend, trendSlope: t.trendSlope } : r;
  });
}

/** The projects of a process without any open, shared by every such row (frozen). */
const NO_PROJECTS = Object.freeze([]) as unknown as ImprovementProject[];

/**
 * A ranking as numbers, one entry per process of its plan (plan.processes, by position): what the list shows
 * and sorts on, kept in typed arrays, and the process's judged fields (judged). A full row (rowAt) is built only
 * for the rows someone looks at — the details, the CSV, the command line: at company size the rows were most of
 * a recompute's time and garbage, and the portfolio's list shows some thirty at a time.
 *
 * `judged`, `badgesAt` and `rowAt` read the judging kept with the prepared window, which the next ranking of the
 * same records and window writes over when it judges under other targets: use a ranked portfolio before ranking
 * again (the worker keeps only its last one; rankPortfolio builds its rows at once).
 */
export interface RankedPortfolio {
  plan: RankingPlan;
  /** Positions in plan.processes, in the order asked for (sortPositions). */
  order: Uint32Array;
  /** Per position: STATUS_ORDER position; 1 where some characteristic has window figures (yield, cost known). */
  status: Uint8Array;
  figured: Uint8Array;
  /** Per position, where `figured`: yield, cost per year, z-level as reported; the priority of every one. */
  yield: Float64Array;
  costPerYear: Float64Array;
  zLevel: Float64Array;
  priority: Float64Array;
  /** The process's profile (undefined where its context has none). */
  profileAt(position: number): ContextProfile | undefined;
  /** How each process was judged, by position: its weakest characteristic and that one's figures. */
  judged: JudgedColumns;
  /** Badges of the process as its row lists them (interned lists, shared). */
  badgesAt(position: number): Badge[];
  /** The full row of a process, as rankPortfolio gives it. */
  rowAt(position: number): ProcessRow;
}

/**
 * The priority score (PRIORITY_FORMULA), from a row's gap, cost, risk weight (RISK_WEIGHT) and whether meeting is
 * not shown.
 */
function priorityOf(
  weights: RankingWeights,
  zGap: number,
  cost: number | undefined,
  riskWeight: number,
  notShown: number
): number {
  // A gap not known is Infinity here (the sort's key): no shortfall, as 0 would be.
  return (
    weights.gap * Math.max(0, -zGap) +
    weights.cost * Math.log10(1 + (cost ?? 0)) +
    weights.risk * riskWeight +
    weights.confidence * notShown
  );
}

/** The badge variant of a profile (processBadges). */
function variantOf(profile: ContextProfile | undefined): BadgeVariant {
  return !profile ? 'none' : profile.reporting === 'short-term' ? 'short-term' : 'long-term';
}

/**
 * Ranks the portfolio into numbers (RankedPortfolio); ties broken by zGap (lower first), cost (higher first),
 * process name, then id. Every process is judged (kept per judging key, see judgeProcess) and scored; no row is
 * built.
 */
export function rankedPortfolio(
  records: PortfolioRecords,
  profiles: readonly ContextProfile[],
  options: RankingOptions
): RankedPortfolio {
  const weights = options.weights ?? DEFAULT_WEIGHTS;
  const { months, model } = rankingContext(records, options);
  const plan = rankingPlan(records, model);
  const window = preparedFor(plan, model, options, months);
  const count = plan.processes.length;
  const figured = new Uint8Array(count);
  const yields = new Float64Array(count);
  const cost = new Float64Array(count);
  const zLevel = new Float64Array(count);
  const priority = new Float64Array(count);
  const profileOf = new Array<ContextProfile | undefined>(count);
  // Judging keys of the profiles met, worked out once per profile in this ranking.
  const keys = new Map<ContextProfile | undefined, string>();
  for (let p = 0; p < count; p += 1) {
    const process = plan.processes[p]!;
    const profile = profileFor(profiles, process.contextId);
    profileOf[p] = profile;
    let key = keys.get(profile);
    if (key === undefined) keys.set(profile, (key = judgingKeyOf(profile)));
    // Judged again only under a profile that judges differently (the judging is kept, like the windows).
    if (window.judgedKey[p] !== key) {
      if (window.filled[p] === 0) fillProcess(window, plan, p);
      else if (!processCurrent(window, plan, p)) refillProcess(window, plan, p);
      judgeProcess(window, plan, p, profile, key);
    }
    const known = window.weakest[p]! >= 0;
    const c = known ? costPerYear(1 - window.yield[p]!, process) : undefined;
    figured[p] = known ? 1 : 0;
    yields[p] = known ? window.yield[p]! : NaN;
    cost[p] = c ?? NaN;
    zLevel[p] = known ? window.zLevel[p]! + shortTermShift(profile) : NaN;
    const gap = window.gap[p]!;
    priority[p] = priorityOf(
      weights,
      gap,
      c,
      RISK_WEIGHT[RISK_CLASSES[window.risk[p]!]!],
      window.notShown[p]!
    );
  }
  const order = sortPositions(plan, options.order ?? 'priority', { window, figured, cost, priority });
  return {
    plan,
    order,
    // Its own copy: the window's is judged over by the next ranking (see RankedPortfolio).
    status: window.status.slice(),
    figured,
    yield: yields,
    costPerYear: cost,
    zLevel,
    priority,
    profileAt: (p) => profileOf[p],
    judged: window,
    badgesAt: (p) => processBadges(window, p, variantOf(profileOf[p])),
    rowAt: (p) => {
      const profile = profileOf[p];
      const key = keys.get(profile)!;
      // The columns are shared by every plan of the model: a row computed again since for another record set is
      // computed again for this one, and the process judged again, before its row is built from them.
      if (!processCurrent(window, plan, p)) {
        refillProcess(window, plan, p);
        judgeProcess(window, plan, p, profile, key);
      }
      return processRowOf(plan, p, window, profile, key, priority[p]!);
    }
  };
}

/**
 * A process's full row from its prepared window (the numbers rankedPortfolio sorts on, and its characteristics'
 * rows).
 */
function processRowOf(
  plan: RankingPlan,
  p: number,
  window: PreparedWindow,
  profile: ContextProfile | undefined,
  key: string,
  priority: number
): ProcessRow {
  const windows = preparedProcessAt(window, plan, p);
  const process = plan.processes[p]!;
  const shift = shortTermShift(profile);
  const charRows = rowsOf(windows, profile, key);
  const w = window.weakest[p]!;
  const weakest = w >= 0 ? charRows[w] : undefined;
  const y = weakest ? window.yield[p]! : undefined;
  const cost = y !== undefined ? costPerYear(1 - y, process) : undefined;
  const needZ = weakest?.requiredZ;
  const ppmAtTarget = needZ !== undefined ? ppmAtLongTermZ(needZ - shift) : undefined;
  // One object literal with every field (undefined where not known): rows built field by field went through
  // a dozen shapes each.
  return {
    process,
    site: plan.sites[p]!,
    profile,
    characteristics: charRows,
    status: STATUS_ORDER[window.status[p]!]!,
    yield: y,
    ppm: y !== undefined ? (1 - y) * 1e6 : undefined,
    zLevel: y !== undefined ? window.zLevel[p]! + shift : undefined,
    zBasis: zBasisOf(profile),
    weakest,
    zGap: weakest?.zGap,
    requiredZ: needZ,
    ppmAtTarget,
    gainIfMet:
      ppmAtTarget !== undefined && cost !== undefined
        ? Math.max(0, cost - costPerYear(ppmAtTarget / 1e6, process))
        : undefined,
    costPerYear: cost,
    trend: shiftedTrend(windows, shift),
    trendSlope: windows.trendSlope,
    badges: processBadges(window, p, variantOf(profile)),
    projects: plan.openProjects[p] ?? NO_PROJECTS,
    priority,
    riskClass: RISK_CLASSES[window.risk[p]!]!
  };
}

/** Ranks the portfolio into full rows: every row of rankedPortfolio, in its order. */
export function rankPortfolio(
  records: PortfolioRecords,
  profiles: readonly ContextProfile[],
  options: RankingOptions
): ProcessRow[] {
  const ranked = rankedPortfolio(records, profiles, options);
  const rows = new Array<ProcessRow>(ranked.order.length);
  for (let i = 0; i < rows.length; i += 1) rows[i] = ranked.rowAt(ranked.order[i]!);
  return rows;
}

/**
 * Deterministic order of the plan's positions: the chosen key, then zGap ascending, cost descending, process
 * name, process id. Keys are read from typed arrays and an index is sorted.
 */
function sortPositions(
  plan: RankingPlan,
  order: RankingOrder,
  by: { window: PreparedWindow; figured: Uint8Array; cost: Float64Array; priority: Float64Array }
): Uint32Array {
  const n = plan.processes.length;
  const first = new Float64Array(n);
  const cost = new Float64Array(n);
  const at = new Uint32Array(n);
  const gap = by.window.gap;
  for (let i = 0; i < n; i += 1) {
    const known = by.figured[i] === 1;
    switch (order) {
      case 'priority':
        first[i] = -by.priority[i]!;
        break;
      case 'gap':
        first[i] = gap[i]!;
        break;
      case 'cost':
        first[i] = known ? -by.cost[i]! : Infinity;
        break;
      case 'risk':
        first[i] = -RISK_WEIGHT[RISK_CLASSES[by.window.risk[i]!]!];
        break;
      case 'confidence':
        first[i] = by.window.status[i]!;
        break;
    }
    cost[i] = known ? by.cost[i]! : 0;
    at[i] = i;
  }
  const processes = plan.processes;
  // Keys compared as the differences of the rows' own values once were: unordered (NaN, or Infinity beside
  // Infinity) counts as equal and passes to the next key. -1, 0 or 1 rather than a difference: a difference is a
  // double, allocated on every call while the comparison runs uncompiled (5 MB in a first ranking at 20 000, by
  // V8's sampling heap profiler). (A radix sort of the first key, and a native sort of the keys' bits with the
  // position in the low bits, ran no faster than this in a first ranking, where their loops run uncompiled.)
  return at.sort(
    (a, b) =>
      order3(first[a]!, first[b]!) ||
      order3(gap[a]!, gap[b]!) ||
      order3(cost[b]!, cost[a]!) ||
      processes[a]!.name.localeCompare(processes[b]!.name) ||
      processes[a]!.id.localeCompare(processes[b]!.id)
  );
}

/** −1, 1, or 0 when equal or unordered (NaN). */
function order3(x: number, y: number): number {
  return x < y ? -1 : x > y ? 1 : 0;
}
