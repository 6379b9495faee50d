import { normalCdf, normalSf, normalUpperQuantile } from '../stats/normal-distribution';
import { summariseMoments } from '../stats/pooled-moments';
import { leastSquaresSlope } from '../stats/trend-slope';
import { windowFiguresOfStudy, type WindowFigures } from './window-figures';
import type { Characteristic, RiskClass } from './characteristic';
import { profileFor, shortTermShift, zBasisOf, type ContextProfile } from './context-profile';
import { addMonths } from './period';
import { firstAtOrAfter, monthOrdinal, portfolioIndex, type PortfolioIndex } from './portfolio-index';
import type { Process } from './process';
import type { Study } from './study';
import { limitsFor, limitVersionOf } from './specification-history';
import { windowData } from './window-study';

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
  type RankingOptions,
  type RankingOrder
} from './portfolio-terms';

export * from './portfolio-terms';

/**
 * A month's yield for the trend line, from the normal model of the month's mean and sd (counts exactly): the
 * trend shows direction, so it skips the model search that the window figures get.
 */
export function quickYield(study: Study, c: Characteristic): number | undefined {
  const d = study.data;
  if (d.kind === 'defectives') return 1 - d.defectives / d.units;
  if (d.kind === 'defects') return Math.exp(-d.defects / d.units);
  let m: number;
  let sd: number;
  if (d.kind === 'summary') ({ mean: m, sd } = d);
  else {
    if (d.values.length < 2) return undefined;
    ({ mean: m, sd } = summariseMoments(d.values));
  }
  if (!(sd > 0)) return undefined;
  const { lsl, usl } = limitsFor(c, study.period);
  const below = lsl !== undefined ? normalCdf((lsl - m) / sd) : 0;
  const above = usl !== undefined ? normalSf((usl - m) / sd) : 0;
  return 1 - below - above;
}

const RISK_WEIGHT: Record<RiskClass, number> = { standard: 0, key: 1, safety: 2 };

/** Required z (as reported) for a profile and risk class: the one definition of the required level. */
export function requiredZ(profile: ContextProfile, risk: RiskClass): number {
  const level = profile.levels[risk];
  const shift = shortTermShift(profile);
  switch (profile.measure) {
    case 'index':
      return 3 * level + shift;
    case 'zLevel':
      return level;
    case 'ppm':
      return normalUpperQuantile(Math.min(1, level / 1e6)) + shift;
  }
}

function badgesOf(r: WindowFigures, profile: ContextProfile | undefined): Badge[] {
  const b: Badge[] = [];
  if (r.kind === 'measured' && r.model !== 'normal') b.push('non-normal model');
  if (r.kind === 'summary') b.push('summary only');
  if (r.kind === 'defectives' || r.kind === 'defects') b.push('counted data');
  if (r.stable === false) b.push('not shown stable');
  if (r.kind === 'measured' || r.kind === 'summary' ? r.n < 30 : r.n < 100) b.push('small sample');
  if (profile?.reporting === 'short-term') b.push('shift convention');
  return b;
}

/**
 * The figures a characteristic is judged on, per unit as its row shows them: the long-term z-level and its
 * one-sided lower bound, and the fraction of units out of specification (defective) and its one-sided upper
 * bound. For defects, a unit is defective when it has at least one defect: 1 − e^(−DPU).
 */
export function perUnitFigures(result: WindowFigures): {
  z: number;
  zBound?: number;
  fraction: number;
  fractionBound?: number;
} {
  if (result.kind === 'defects') {
    const fraction = 1 - result.yield;
    const dpuBound = result.bounds.dpuUpper;
    const fractionBound = dpuBound === undefined ? undefined : 1 - Math.exp(-dpuBound);
    return {
      z: normalUpperQuantile(Math.min(1, Math.max(0, fraction))),
      fraction,
      ...(fractionBound !== undefined
        ? { fractionBound, zBound: normalUpperQuantile(Math.min(1, fractionBound)) }
        : {})
    };
  }
  const fraction = result.ppmTotal !== undefined ? result.ppmTotal / 1e6 : 1 - result.yield;
  const zBound = result.bounds.zLevelLower;
  const fractionBound = result.bounds.fractionUpper;
  return {
    z: result.zLevel,
    fraction,
    ...(zBound !== undefined ? { zBound } : {}),
    ...(fractionBound !== undefined ? { fractionBound } : {})
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
  const risk = characteristic.riskClass;
  const required = profile ? profile.levels[risk] : NaN;
  if (!result || !profile)
    return {
      characteristic,
      status: 'no recent data',
      required,
      badges: [],
      months,
      ...(result ? { result } : {})
    };
  const shift = shortTermShift(profile);
  const unit = perUnitFigures(result);
  const zReported = unit.z + shift;
  const zBound = unit.zBound !== undefined ? unit.zBound + shift : undefined;
  const needZ = requiredZ(profile, risk);
  let estimate: number;
  let bound: number | undefined;
  let meets: (v: number) => boolean;
  let zEstimate = zReported;
  switch (profile.measure) {
    case 'index': {
      const measured = result.kind === 'measured' || result.kind === 'summary';
      const idx = measured ? (result.cpk ?? result.ppk) : undefined;
      const idxBound = result.cpk !== undefined ? result.bounds.cpkLower : result.bounds.ppkLower;
      // Counted data have no index: they are judged on their z-level against 3 × the required index.
      estimate = idx ?? zReported;
      bound = idx !== undefined ? idxBound : zBound;
      const level = idx !== undefined ? required : needZ;
      meets = (v) => v >= level;
      if (idx !== undefined) zEstimate = 3 * idx + shift;
      break;
    }
    case 'zLevel':
      estimate = zReported;
      bound = zBound;
      meets = (v) => v >= required;
      break;
    case 'ppm': {
      estimate = unit.fraction * 1e6;
      bound = unit.fractionBound !== undefined ? unit.fractionBound * 1e6 : undefined;
      meets = (v) => v <= required;
      break;
    }
  }
  const unstable = result.stable === false;
  const status: CharacteristicStatus = !meets(estimate)
    ? 'short'
    : bound !== undefined && meets(bound) && !unstable
      ? 'meets, shown'
      : 'meets, not shown';
  const row: CharacteristicRow = {
    characteristic,
    status,
    result,
    estimate,
    required,
    requiredZ: needZ,
    zShown: zReported,
    zGap: zEstimate - needZ,
    badges: badgesOf(result, profile),
    months,
    ...(bound !== undefined ? { bound } : {})
  };
  // Centring or spread, for measured data with both limits, judged against the requirement as an index.
  const { lsl, usl } = period ? limitsFor(characteristic, period) : characteristic;
  const sdNow = result.sdWithin ?? result.sdOverall;
  if (lsl !== undefined && usl !== undefined && sdNow !== undefined && sdNow > 0) {
    const requiredIndex = (needZ - shift) / 3;
    const centredIndex = (usl - lsl) / (6 * sdNow);
    row.centring = {
      centredIndex,
      sdNow,
      sdNeeded: (usl - lsl) / (6 * requiredIndex),
      centringMeets: centredIndex >= requiredIndex
    };
  }
  return row;
}

/** Cost of poor quality per year: fraction defective × monthly volume × 12 × cost per defective unit. */
export function costPerYear(
  fraction: number,
  process: Pick<Process, 'monthlyVolume' | 'costPerDefective'>
): number {
  return fraction * process.monthlyVolume * 12 * process.costPerDefective;
}

function statusRank(s: CharacteristicStatus): number {
  return STATUS_ORDER.indexOf(s);
}

const quickYields = new WeakMap<Study, { characteristic: Characteristic; y: number | undefined }>();

/** quickYield remembered per study and characteristic version (records are immutable once read). */
function rememberedQuickYield(study: Study, c: Characteristic): number | undefined {
  const known = quickYields.get(study);
  if (known && known.characteristic === c) return known.y;
  const y = quickYield(study, c);
  quickYields.set(study, { characteristic: c, y });
  return y;
}

/** What a characteristic's window gives before it is judged: the same for every target, weight and order. */
interface PreparedCharacteristic {
  characteristic: Characteristic;
  figures: WindowFigures | undefined;
  months: number;
  limitsChanged: boolean;
}

/** A process's windows and its monthly trend as long-term z-levels (the context's shift is added when judged). */
interface PreparedProcess {
  characteristics: PreparedCharacteristic[];
  trend: (number | undefined)[];
}

/**
 * Prepared windows per record set (by the identity of its study and characteristic arrays) and window: a
 * change of target, weight or order re-judges these without looking at a study again.
 */
const preparedWindows = new WeakMap<
  readonly Study[],
  { characteristics: readonly Characteristic[]; byWindow: Map<string, Map<string, PreparedProcess>> }
>();

function preparedFor(records: PortfolioRecords, window: string): Map<string, PreparedProcess> {
  let entry = preparedWindows.get(records.studies);
  if (!entry || entry.characteristics !== records.characteristics) {
    entry = { characteristics: records.characteristics, byWindow: new Map() };
    preparedWindows.set(records.studies, entry);
  }
  let prepared = entry.byWindow.get(window);
  if (!prepared) entry.byWindow.set(window, (prepared = new Map()));
  return prepared;
}

function prepareProcess(
  chars: readonly Characteristic[],
  index: PortfolioIndex,
  options: RankingOptions,
  months: { first: string; end: number; firstMonth: number; trendFirstMonth: number; trendMonths: number }
): PreparedProcess {
  const monthly = new Float64Array(months.trendMonths).fill(1); // product of the month's yields
  const monthlyCount = new Int32Array(months.trendMonths);
  const prepared = chars.map((c): PreparedCharacteristic => {
    const held = index.studies.get(c.id);
    const list = held?.list ?? [];
    const ordinals = held?.months ?? new Int32Array(0);
    const to = firstAtOrAfter(ordinals, months.end + 1);
    for (let i = firstAtOrAfter(ordinals, months.trendFirstMonth); i < to; i += 1) {
      const y = rememberedQuickYield(list[i]!, c);
      if (y === undefined) continue;
      const m = ordinals[i]! - months.trendFirstMonth;
      monthly[m]! *= y;
      monthlyCount[m]! += 1;
    }
    // WINDOW_RULE: the window keeps the months under the limits in force in its last month.
    const windowed = list.slice(firstAtOrAfter(ordinals, months.firstMonth), to);
    const changes = c.limitChanges?.length ?? 0;
    const version = changes ? limitVersionOf(c, options.endPeriod) : '';
    const inWindow = changes ? windowed.filter((s) => limitVersionOf(c, s.period) === version) : windowed;
    let cached = options.cache?.get(c, months.first, inWindow);
    if (!cached) {
      const w = windowData(inWindow);
      let result: WindowFigures | undefined;
      if (w) {
        try {
          result = windowFiguresOfStudy({ data: w.data, period: options.endPeriod }, c, w.sdWithin);
        } catch {
          result = undefined;
        }
      }
      cached = { result, months: w?.months.length ?? 0 };
      options.cache?.set(c, months.first, inWindow, cached);
    }
    return {
      characteristic: c,
      figures: cached.result,
      months: cached.months,
      limitsChanged: inWindow.length < windowed.length
    };
  });
  const trend: (number | undefined)[] = [];
  for (let m = 0; m < months.trendMonths; m += 1) {
    const count = monthlyCount[m]!;
    trend.push(
      count > 0 && count === chars.length ? normalUpperQuantile(Math.min(1, 1 - monthly[m]!)) : undefined
    );
  }
  return { characteristics: prepared, trend };
}

/** Ranks the portfolio; ties broken by zGap (lower first), cost (higher first), process name, then id. */
export function rankPortfolio(
  records: PortfolioRecords,
  profiles: readonly ContextProfile[],
  options: RankingOptions
): ProcessRow[] {
  const weights = options.weights ?? DEFAULT_WEIGHTS;
  const trendMonths = options.trendMonths ?? 12;
  const end = monthOrdinal(options.endPeriod);
  const months = {
    first: addMonths(options.endPeriod, -(options.windowMonths - 1)),
    end,
    firstMonth: end - (options.windowMonths - 1),
    trendFirstMonth: end - (trendMonths - 1),
    trendMonths
  };
  const index = portfolioIndex(records);
  const prepared = preparedFor(records, `${options.endPeriod}|${options.windowMonths}|${trendMonths}`);

  const rows: ProcessRow[] = [];
  for (const process of records.processes) {
    if (process.deletedAt || process.archivedAt) continue;
    const site = index.sites.get(process.siteId);
    if (!site) continue;
    const profile = profileFor(profiles, process.contextId);
    const shift = shortTermShift(profile);
    const chars = index.characteristics.get(process.id) ?? [];
    let windows = prepared.get(process.id);
    if (!windows) prepared.set(process.id, (windows = prepareProcess(chars, index, options, months)));
    const charRows = windows.characteristics.map((w) => {
      const row = judgeCharacteristic(w.characteristic, w.figures, profile, w.months, options.endPeriod);
      if (w.limitsChanged) row.badges.push('limits changed');
      return row;
    });
    const withData = charRows.filter((r) => r.result);
    const badges = new Set<Badge>(withData.flatMap((r) => r.badges));
    if (withData.length && withData.length < charRows.length) badges.add('incomplete');
    const riskClass: RiskClass = chars.some((c) => c.riskClass === 'safety')
      ? 'safety'
      : chars.some((c) => c.riskClass === 'key')
        ? 'key'
        : 'standard';
    const row: ProcessRow = {
      process,
      site,
      profile,
      characteristics: charRows,
      status: charRows.length
        ? charRows.reduce<CharacteristicStatus>(
            (worst, r) =>
              r.status !== 'no recent data' && statusRank(r.status) < statusRank(worst) ? r.status : worst,
            'no recent data'
          )
        : 'no recent data',
      trend: [],
      zBasis: zBasisOf(profile),
      badges: [...badges],
      projects: index.openProjects.get(process.id) ?? [],
      priority: 0,
      riskClass
    };
    if (withData.length) {
      const y = withData.reduce((a, r) => a * (r.result as WindowFigures).yield, 1);
      row.yield = y;
      row.ppm = (1 - y) * 1e6;
      row.zLevel = normalUpperQuantile(Math.min(1, 1 - y)) + shift;
      row.weakest = withData.reduce((a, b) => ((b.zGap ?? Infinity) < (a.zGap ?? Infinity) ? b : a));
      row.zGap = row.weakest.zGap;
      row.costPerYear = costPerYear(1 - y, process);
      if (row.weakest.requiredZ !== undefined) {
        row.requiredZ = row.weakest.requiredZ;
        row.ppmAtTarget = normalSf(row.weakest.requiredZ - shift) * 1e6;
        row.gainIfMet = Math.max(0, row.costPerYear - costPerYear(row.ppmAtTarget / 1e6, process));
      }
    }
    for (const z of windows.trend) row.trend.push(z === undefined ? undefined : z + shift);
    const sl = leastSquaresSlope(row.trend);
    if (sl !== undefined) row.trendSlope = sl;
    const notShown = withData.some((r) => r.status !== 'meets, shown') ? 1 : 0;
    row.priority =
      weights.gap * Math.max(0, -(row.zGap ?? 0)) +
      weights.cost * Math.log10(1 + (row.costPerYear ?? 0)) +
      weights.risk * RISK_WEIGHT[riskClass] +
      weights.confidence * notShown;
    rows.push(row);
  }
  return sortRows(rows, options.order ?? 'priority');
}

/** Deterministic order: the chosen key, then zGap ascending, cost descending, process name, process id. */
export function sortRows(rows: ProcessRow[], order: RankingOrder): ProcessRow[] {
  const key = (r: ProcessRow): number => {
    switch (order) {
      case 'priority':
        return -r.priority;
      case 'gap':
        return r.zGap ?? Infinity;
      case 'cost':
        return -(r.costPerYear ?? -Infinity);
      case 'risk':
        return -RISK_WEIGHT[r.riskClass];
      case 'confidence':
        return statusRank(r.status);
    }
  };
  return [...rows].sort(
    (a, b) =>
      key(a) - key(b) ||
      (a.zGap ?? Infinity) - (b.zGap ?? Infinity) ||
      (b.costPerYear ?? 0) - (a.costPerYear ?? 0) ||
      a.process.name.localeCompare(b.process.name) ||
      a.process.id.localeCompare(b.process.id)
  );
}
