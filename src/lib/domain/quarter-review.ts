import { WindowFiguresCache } from './window-figures-cache';
import { median } from '../stats/quantiles';
import { zChangeTest, type ZEstimate } from '../stats/z-change-test';
import { canonicalJson } from './canonical-json';
import { shortTermShift, type ContextProfile } from './context-profile';
import { PROJECT_PHASES, type ImprovementProject } from './improvement-project';
import { addMonths, periodsOfQuarter, quarterOf } from './period';
import { moneyTotals, ratesStatement, type ReportingCurrency } from './reporting-currency';
import {
  BADGE_EXPLANATIONS,
  portfolioStandings,
  rankPortfolio,
  standingOfRow,
  type Badge,
  type CharacteristicRow,
  type CharacteristicStatus,
  type RankingOptions,
  type FiguresCache,
  type PortfolioRecords,
  type ProcessRow,
  type ProcessStanding
} from './portfolio-ranking';
import type {
  ReviewControlProject,
  ReviewFigures,
  ReviewHeadline,
  ReviewMover,
  ReviewProcessLine,
  ReviewSite
} from './review-figures';

/**
 * The quarterly review: every process judged on the three months of the quarter (the same ranking as the
 * portfolio page), compared with the previous quarter and the same quarter a year before, with movers tested
 * against noise, a summary per site, the share meeting target over eight quarters, the improvement pipeline, and
 * the assumptions the figures rest on.
 */
export interface ReviewOptions {
  quarter: string;
  /** Sites to review; all when empty or absent. */
  siteIds?: readonly string[];
  trendQuarters?: number;
  cache?: FiguresCache;
  /** Reporting currency and rates for converted totals; amounts are always also given per currency. */
  reporting?: ReportingCurrency;
}

export function shiftQuarter(quarter: string, quarters: number): string {
  return quarterOf(addMonths(periodsOfQuarter(quarter)[0]!, 3 * quarters));
}

const MEETS = new Set<CharacteristicStatus>(['meets, shown', 'meets, not shown']);

/** How many processes were reviewed (had data in the quarter) and how many of them meet their target. */
function meetingOf(statuses: Iterable<CharacteristicStatus>) {
  let processes = 0;
  let reviewed = 0;
  let meeting = 0;
  let meetingShown = 0;
  for (const status of statuses) {
    processes += 1;
    if (status === 'no recent data') continue;
    reviewed += 1;
    if (MEETS.has(status)) meeting += 1;
    if (status === 'meets, shown') meetingShown += 1;
  }
  return {
    processes,
    reviewed,
    meeting,
    meetingShown,
    share: reviewed ? meeting / reviewed : undefined,
    shareShown: reviewed ? meetingShown / reviewed : undefined
  };
}

/**
 * Headline figures of one quarter's rows. `reviewed` counts processes with data in the quarter; shares are of
 * those. `stale` counts reviewed processes some of whose characteristics reported nothing in the quarter,
 * `missing` the processes with no data at all. Cost is summed per currency (no conversion).
 */
export function headlineOf(
  quarter: string,
  rows: readonly ProcessStanding[],
  reporting?: ReportingCurrency
): ReviewHeadline {
  const reviewed = rows.filter((r) => r.status !== 'no recent data');
  const m = meetingOf(rows.map((r) => r.status));
  return {
    quarter,
    processes: m.processes,
    reviewed: m.reviewed,
    meeting: m.meeting,
    meetingShown: m.meetingShown,
    share: m.share,
    shareShown: m.shareShown,
    ...costsOf(reviewed, reporting),
    stale: reviewed.filter((r) => r.incomplete).length,
    missing: rows.length - reviewed.length
  };
}

function costsOf(rows: readonly ProcessStanding[], reporting: ReportingCurrency | undefined) {
  const totals = moneyTotals(
    rows.flatMap((r) =>
      r.costPerYear === undefined ? [] : [{ amount: r.costPerYear, currency: r.process.currency }]
    ),
    reporting
  );
  return { cost: totals.byCurrency, ...(totals.reporting ? { costReporting: totals.reporting } : {}) };
}

/** The characteristic that loses most (largest ppm): the one that sets a process's z-level. */
function dominant(row: ProcessRow): CharacteristicRow | undefined {
  let best: CharacteristicRow | undefined;
  for (const c of row.characteristics) {
    if (!c.result) continue;
    if (!best || 1 - c.result.yield > 1 - best.result!.yield) best = c;
  }
  return best;
}

function estimateOf(c: CharacteristicRow, shift: number): ZEstimate {
  const r = c.result!;
  if (r.kind === 'measured' || r.kind === 'summary') return { z: r.zLevel + shift, n: r.n, kind: 'measured' };
  // Defects: chances are units × opportunities (DPU / DPO = opportunities per unit).
  const perUnit = r.kind === 'defects' && r.dpu !== undefined && r.dpmo ? r.dpu / (r.dpmo / 1e6) : 1;
  const p = r.kind === 'defects' ? (r.dpmo ?? 0) / 1e6 : (r.p ?? 1 - r.yield);
  return { z: r.zLevel + shift, n: r.n * perUnit, kind: 'counted', p };
}

const shiftOf = (row: ProcessRow) => shortTermShift(row.profile);

/** Change of one process between two quarters, on the characteristic that sets its level now. */
export function moverOf(after: ProcessRow, before: ProcessRow | undefined): ReviewMover | undefined {
  if (!before || after.zLevel === undefined || before.zLevel === undefined) return undefined;
  const now = dominant(after);
  const then = now && before.characteristics.find((c) => c.characteristic.id === now.characteristic.id);
  const test =
    now && then?.result
      ? zChangeTest(estimateOf(then, shiftOf(before)), estimateOf(now, shiftOf(after)))
      : undefined;
  return {
    processId: after.process.id,
    process: after.process.name,
    site: after.site.name,
    characteristic: now?.characteristic.name ?? '',
    zBefore: before.zLevel,
    zAfter: after.zLevel,
    change: after.zLevel - before.zLevel,
    ppmBefore: before.ppm ?? 0,
    ppmAfter: after.ppm ?? 0,
    pValue: test?.pValue,
    beyondNoise: test?.beyondNoise
  };
}

function lineOf(row: ProcessRow): ReviewProcessLine {
  const w = row.weakest;
  const centring = w?.centring;
  return {
    processId: row.process.id,
    process: row.process.name,
    site: row.site.name,
    status: row.status,
    zLevel: row.zLevel,
    zBasis: row.zBasis,
    required: w ? w.required : undefined,
    requiredZ: row.requiredZ,
    zGap: row.zGap,
    ppm: row.ppm,
    costPerYear: row.costPerYear,
    currency: row.process.currency,
    weakest: w?.characteristic.name,
    // For a shortfall: would centring alone meet the target, or must the spread shrink?
    spreadOrCentre:
      centring && row.status === 'short' ? (centring.centringMeets ? 'centring' : 'spread') : undefined,
    priority: row.priority
  };
}

const ASSUMPTION_TOPICS: Badge[] = [
  'non-normal model',
  'summary only',
  'counted data',
  'small sample',
  'not shown stable',
  'shift convention',
  'incomplete'
];

/**
 * The records of the chosen sites only. The same record set for the same choice (the last one made is kept per
 * record set): what a ranking resolves and keeps for a record set (its plan, the quarters it judged) is then
 * found again when the review is built anew for those sites, in another quarter or currency.
 */
function scoped(records: PortfolioRecords, siteIds: readonly string[] | undefined): PortfolioRecords {
  if (!siteIds || siteIds.length === 0) return records;
  const key = [...siteIds].sort().join('\n');
  const kept = scopedRecords.get(records);
  if (kept?.key === key) return kept.records;
  const sites = new Set(siteIds);
  const chosen = { ...records, sites: records.sites.filter((s) => sites.has(s.id)) };
  scopedRecords.set(records, { key, records: chosen });
  return chosen;
}

const scopedRecords = new WeakMap<PortfolioRecords, { key: string; records: PortfolioRecords }>();

export function buildQuarterReview(
  allRecords: PortfolioRecords,
  profiles: readonly ContextProfile[],
  options: ReviewOptions
): ReviewFigures {
  const records = scoped(allRecords, options.siteIds);
  const cache: FiguresCache = options.cache ?? new WindowFiguresCache();
  const rankingOptions = (quarter: string): RankingOptions => ({
    endPeriod: periodsOfQuarter(quarter)[2]!,
    windowMonths: 3,
    // The review shows no monthly trend line: none is computed (ten quarters × every characteristic).
    trendMonths: 0,
    cache
  });
  const rank = (quarter: string) => rankPortfolio(records, profiles, rankingOptions(quarter));
  const quarter = options.quarter;
  const previousQuarter = shiftQuarter(quarter, -1);
  const yearAgoQuarter = shiftQuarter(quarter, -4);
  const trendQuarters = options.trendQuarters ?? 8;
  // Full rows only for the quarters the review shows in detail (this one and the one before); of the trend's
  // other quarters, and of the year-ago quarter whose headline alone is shown, each process is judged without a
  // row (portfolioStandings): at company size ten quarters of rows were hundreds of megabytes, and a full
  // ranking of the year-ago quarter a sixth of the review's time.
  const detailed = new Set([quarter, previousQuarter]);
  const ranked = new Map<string, ProcessRow[]>();
  let yearAgo: ReviewHeadline | undefined;
  const standingsOf = (q: string) => {
    const standings = portfolioStandings(records, profiles, rankingOptions(q));
    if (q === yearAgoQuarter) yearAgo = headlineOf(q, standings, options.reporting);
    return standings;
  };
  const trend: ReviewFigures['shareTrend'] = [];
  for (let i = trendQuarters - 1; i >= 0; i--) {
    const q = shiftQuarter(quarter, -i);
    let statuses: CharacteristicStatus[];
    if (detailed.has(q)) {
      const rows = rank(q);
      ranked.set(q, rows);
      statuses = rows.map((r) => r.status);
    } else statuses = standingsOf(q).map((s) => s.status);
    const m = meetingOf(statuses);
    trend.push({ quarter: q, reviewed: m.reviewed, share: m.share, shareShown: m.shareShown });
  }
  if (!yearAgo) standingsOf(yearAgoQuarter);
  if (!ranked.has(previousQuarter)) ranked.set(previousQuarter, rank(previousQuarter));
  if (!ranked.has(quarter)) ranked.set(quarter, rank(quarter));
  const current = ranked.get(quarter)!;
  const previous = ranked.get(previousQuarter)!;
  const previousById = new Map(previous.map((r) => [r.process.id, r]));

  const movers = current
    .map((r) => moverOf(r, previousById.get(r.process.id)))
    .filter((m): m is ReviewMover => m !== undefined);
  const beyond = movers.filter((m) => m.beyondNoise);
  const improvers = beyond
    .filter((m) => m.change > 0)
    .sort((a, b) => b.change - a.change || a.processId.localeCompare(b.processId));
  const decliners = beyond
    .filter((m) => m.change < 0)
    .sort((a, b) => a.change - b.change || a.processId.localeCompare(b.processId));

  const rowsBySite = new Map<string, ProcessRow[]>();
  for (const r of current) {
    const list = rowsBySite.get(r.site.id);
    if (list) list.push(r);
    else rowsBySite.set(r.site.id, [r]);
  }
  const sites: ReviewSite[] = [...rowsBySite]
    .map(([siteId, rows]) => {
      const h = headlineOf(quarter, rows.map(standingOfRow), options.reporting);
      const zLevels = rows.flatMap((r) =>
        r.zLevel !== undefined && Number.isFinite(r.zLevel) ? [r.zLevel] : []
      );
      return {
        siteId,
        site: rows[0]!.site.name,
        processes: h.processes,
        reviewed: h.reviewed,
        meeting: h.meeting,
        share: h.share,
        cost: h.cost,
        zLevels,
        medianZ: median(zLevels)
      };
    })
    .sort((a, b) => a.site.localeCompare(b.site) || a.siteId.localeCompare(b.siteId));

  const projects = current.flatMap((r) => r.projects.map((p) => ({ project: p, row: r })));
  const pipeline = PROJECT_PHASES.map((phase) => {
    const inPhase = projects.filter((p) => p.project.phase === phase);
    const totals = moneyTotals(
      inPhase.map((p) => ({ amount: p.project.expectedAnnualSaving, currency: p.row.process.currency })),
      options.reporting
    );
    return {
      phase,
      projects: inPhase.length,
      savings: totals.byCurrency,
      ...(totals.reporting ? { savingReporting: totals.reporting } : {})
    };
  });
  // Expected against achieved: projects running in Control, and those closed during the quarter (their row no
  // longer lists them, since closed projects are no longer work on the process).
  const rowById = new Map(current.map((r) => [r.process.id, r]));
  const closedInQuarter = records.projects.flatMap((project) => {
    const row = rowById.get(project.processId);
    if (!row || project.deletedAt || project.state !== 'closed') return [];
    const closing = [...(project.history ?? [])].reverse().find((h) => h.change.startsWith('closed'));
    return closing && quarterOf(closing.at.slice(0, 7)) === quarter ? [{ project, row }] : [];
  });
  const controlled = [...projects.filter((p) => p.project.phase === 'Control'), ...closedInQuarter];
  // "Before": the quarter before the project started; "after": the quarter reviewed.
  const beforeQuarterOf = (project: ImprovementProject) =>
    shiftQuarter(quarterOf(project.startDate.slice(0, 7)), -1);
  // Each quarter before a project started is ranked once, for the processes whose projects need it: a row
  // depends on its own process alone, and ranking every process for a few hundred projects was a tenth of the
  // review at company size.
  const byIdOfQuarter = new Map<string, Map<string, ProcessRow>>();
  for (const { project } of controlled) {
    const q = beforeQuarterOf(project);
    if (byIdOfQuarter.has(q)) continue;
    let rows = ranked.get(q);
    if (!rows) {
      const ids = new Set(
        controlled.filter((c) => beforeQuarterOf(c.project) === q).map((c) => c.project.processId)
      );
      const processes = records.processes.filter((p) => ids.has(p.id));
      rows = rankPortfolio({ ...records, processes }, profiles, rankingOptions(q));
    }
    byIdOfQuarter.set(q, new Map(rows.map((r) => [r.process.id, r])));
  }
  const control: ReviewControlProject[] = controlled
    .map(({ project, row }) => {
      const beforeQuarter = beforeQuarterOf(project);
      const before = byIdOfQuarter.get(beforeQuarter)!.get(row.process.id);
      const mover = moverOf(row, before);
      return {
        projectId: project.id,
        title: project.title,
        process: row.process.name,
        currency: row.process.currency,
        expectedSaving: project.expectedAnnualSaving,
        beforeQuarter,
        zBefore: before?.zLevel,
        zAfter: row.zLevel,
        costBefore: before?.costPerYear,
        costAfter: row.costPerYear,
        achievedSaving:
          before?.costPerYear !== undefined && row.costPerYear !== undefined
            ? before.costPerYear - row.costPerYear
            : undefined,
        pValue: mover?.pValue,
        beyondNoise: mover?.beyondNoise,
        ...(project.state === 'closed' ? { closed: true } : {}),
        ...(project.achieved?.note ? { reportedResult: project.achieved.note.slice(0, 400) } : {}),
        ...(project.achieved?.level !== undefined ? { reportedLevel: project.achieved.level } : {})
      };
    })
    .sort((a, b) => a.title.localeCompare(b.title) || a.projectId.localeCompare(b.projectId));

  const assumptions = ASSUMPTION_TOPICS.map((badge) => ({
    topic: badge as string,
    explanation: BADGE_EXPLANATIONS[badge],
    processes: current
      .filter((r) => r.badges.includes(badge))
      .map((r) => `${r.process.name} (${r.site.name})`)
  }));
  assumptions.push({
    topic: 'currencies',
    explanation: ratesStatement(options.reporting),
    processes: []
  });
  assumptions.push({
    topic: 'no data',
    explanation:
      'No study was logged for any characteristic of these processes in the quarter; they are not judged.',
    processes: current
      .filter((r) => r.status === 'no recent data')
      .map((r) => `${r.process.name} (${r.site.name})`)
  });

  return {
    quarter,
    previousQuarter,
    yearAgoQuarter,
    siteIds: [...(options.siteIds ?? [])].sort(),
    headline: headlineOf(quarter, current.map(standingOfRow), options.reporting),
    previous: headlineOf(previousQuarter, previous.map(standingOfRow), options.reporting),
    yearAgo: yearAgo!,
    processes: current.map(lineOf),
    movers,
    improvers: improvers.slice(0, 10),
    decliners: decliners.slice(0, 10),
    movedWithinNoise: movers.length - beyond.length,
    sites,
    shareTrend: trend,
    pipeline,
    control,
    assumptions,
    ...(options.reporting
      ? {
          reporting: {
            currency: options.reporting.currency,
            rates: options.reporting.rates,
            statement: ratesStatement(options.reporting)
          }
        }
      : {})
  };
}

/** Parts of a frozen review whose figures differ from the live ones (late data, edits since the freeze). */
export function snapshotDifferences(frozen: ReviewFigures, live: ReviewFigures): string[] {
  const parts: [string, (f: ReviewFigures) => unknown][] = [
    ['headline figures', (f) => [f.headline, f.previous, f.yearAgo]],
    ['process figures', (f) => f.processes],
    ['movers', (f) => f.movers],
    ['site summary', (f) => f.sites],
    ['trend', (f) => f.shareTrend],
    ['pipeline', (f) => [f.pipeline, f.control]],
    ['assumptions', (f) => f.assumptions]
  ];
  const text = (value: unknown) => canonicalJson(toSignificantDigits(value));
  return parts.filter(([, get]) => text(get(frozen)) !== text(get(live))).map(([name]) => name);
}

/** Digits a figure is compared to when a frozen review is checked against the live one. */
const COMPARED_DIGITS = 12;

/**
 * A copy with every number rounded to COMPARED_DIGITS significant digits. A sum taken in another order (the
 * same costs, listed differently by a newer version of the app) differs in its last bits: that is no change of
 * a figure, and a frozen review must not be reported as out of date for it.
 */
function toSignificantDigits(value: unknown): unknown {
  if (typeof value === 'number')
    return Number.isFinite(value) && value !== 0 ? Number(value.toPrecision(COMPARED_DIGITS)) : value;
  if (Array.isArray(value)) return value.map(toSignificantDigits);
  if (value !== null && typeof value === 'object')
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, toSignificantDigits(v)]));
  return value;
}
