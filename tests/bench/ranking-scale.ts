/**
 * A company-size portfolio generated as the app holds it, its read model and the typed-array baseline's arrays
 * filled from it, and a first ranking measured against that baseline: what the ranking bench measures in Node's
 * processes (ranking-bench.ts) and the browser bench in a worker of Chromium's (browser/first-ranking-entry.ts),
 * where the app's own ranking runs. Nothing here may need Node.
 */
import { WindowFiguresCache } from '../../src/lib/domain/window-figures-cache';
import type { Characteristic } from '../../src/lib/domain/characteristic';
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { PROJECT_PHASES, type ImprovementProject } from '../../src/lib/domain/improvement-project';
import { addMonths } from '../../src/lib/domain/period';
import {
  processTrends,
  rankedPortfolio,
  type FiguresCache,
  type PortfolioRecords,
  type RankingOptions
} from '../../src/lib/domain/portfolio-ranking';
import { MonthlyStatistics } from '../../src/lib/domain/monthly-statistics';
import { listColumnsOf } from '../../src/lib/domain/portfolio-list-of-ranking';
import type { Process } from '../../src/lib/domain/process';
import type { Study } from '../../src/lib/domain/study';
import { inIdOrder, seededIds } from './seeded-ids';
import {
  describeCharacteristics,
  fillTypedPortfolio,
  typedPortfolioOf,
  typedRanking
} from './typed-array-baseline';

export const BENCH_FIRST_PERIOD = '2024-01';

/**
 * A generated portfolio, shaped as the app holds it: record ids are random UUIDs (seeded), each record list is in
 * id order (as IndexedDB returns a table), and the studies arrive by characteristic id (as the study shelves are
 * read, storage/study-shelves.ts) — so the read model's rows follow the characteristics' ids, and the processes
 * come in an order of their own. With `sink`, each characteristic's studies go to it (a page at a time) and are
 * not kept: the records then hold no study, as in the app's workers.
 */
export function generatePortfolio(
  processCount: number,
  months: number,
  sink?: (studies: Study[]) => void
): PortfolioRecords {
  let s = 12345;
  const u = () => (s = (s * 48271) % 2147483647) / 2147483647;
  const newId = seededIds(20261205);
  const meta = (id: string) => ({ id, createdAt: '', updatedAt: '', rev: 1, deviceId: 'bench' });
  const contexts = BUILT_IN_PROFILES.map((p) => p.id);
  const siteIds = Array.from({ length: Math.min(50, processCount) }, newId);
  const processes: Process[] = [];
  const characteristics: Characteristic[] = [];
  const studies: Study[] = [];
  const projects: ImprovementProject[] = [];
  for (let p = 0; p < processCount; p += 1) {
    const pid = newId();
    processes.push({
      ...meta(pid),
      siteId: siteIds[p % 50]!,
      name: `Process ${p}`,
      owner: '',
      contextId: contexts[p % contexts.length] as string,
      monthlyVolume: 1000 + p,
      costPerDefective: 5,
      currency: 'EUR'
    });
    // A project on every tenth process, a fifth of them in Control.
    if (p % 10 === 0)
      projects.push({
        ...meta(newId()),
        processId: pid,
        title: `Project ${p}`,
        phase: PROJECT_PHASES[(p / 10) % PROJECT_PHASES.length]!,
        owner: '',
        startDate: '2025-04-01',
        expectedAnnualSaving: 10_000
      });
    const counted = p % 3 === 0;
    characteristics.push({
      ...meta(newId()),
      processId: pid,
      name: 'c',
      unit: '',
      dataKind: counted ? 'counted' : 'measured',
      riskClass: p % 7 === 0 ? 'safety' : 'standard',
      ...(counted ? {} : { lsl: 7, usl: 13 })
    });
  }
  inIdOrder(characteristics).forEach((c, i) => {
    const counted = c.dataKind === 'counted';
    const own: Study[] = [];
    for (let m = 0; m < months; m += 1) {
      own.push({
        ...meta(newId()),
        characteristicId: c.id,
        period: addMonths(BENCH_FIRST_PERIOD, m),
        enteredBy: '',
        data: counted
          ? { kind: 'defectives', units: 2000, defectives: Math.floor(u() * 20) }
          : { kind: 'summary', n: 50, mean: 10 + (u() - 0.5), sd: 0.4 + u() * 0.4 }
      });
    }
    // Through JSON one characteristic at a time: shaped as received, without one giant string at the peak.
    const received = JSON.parse(JSON.stringify(own)) as Study[];
    if (sink) sink(received);
    else for (const study of received) studies.push(study);
    // The generator's garbage is not the app's: collect it as it goes (when the process allows), so that the
    // peak memory printed is that of the records and the ranking, not of how the bench made them.
    if (i % 500 === 499) (globalThis as { gc?: () => void }).gc?.();
  });
  const sites = siteIds.map((id, i) => ({ ...meta(id), name: `Site ${i}`, region: '', timeZone: 'UTC' }));
  return {
    ...(JSON.parse(
      JSON.stringify({
        sites: inIdOrder(sites),
        processes: inIdOrder(processes),
        characteristics,
        projects: inIdOrder(projects)
      })
    ) as Omit<PortfolioRecords, 'studies'>),
    studies
  };
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
}

/** The smallest and largest of some figures as a row's name gives them: `12.5–16.8×`. */
export function spanOf(xs: number[], digits: number, unit: string): string {
  return `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}${unit}`;
}

export const MONTHS = 36;
/** A tall window shows some 30 rows of the list; their trend lines are drawn as they come into view. */
export const ON_SCREEN = 40;

/**
 * A portfolio of `size` processes generated into the read model and the baseline's arrays, the baseline timed
 * five times (its median is what every ranking row is measured against; its first run, cold as the ranking's
 * first computation is, is kept beside it), and the ranking as the app's worker does it.
 */
export function preparedScale(size: number) {
  // The studies arrive a process at a time and go into the read model and the baseline's arrays; no study
  // object outlives its page, as in the app's workers (storage/portfolio-reader.ts).
  const statistics = new MonthlyStatistics();
  const typed = typedPortfolioOf(size, MONTHS, BENCH_FIRST_PERIOD);
  let buildMs = 0;
  const bare = generatePortfolio(size, MONTHS, (page) => {
    fillTypedPortfolio(typed, page);
    buildMs += timed(() => statistics.appendNew(page));
  });
  describeCharacteristics(typed, bare.characteristics);
  (globalThis as { gc?: () => void }).gc?.();
  const records: PortfolioRecords = { ...bare, studies: [], statistics };
  const end = MONTHS - 1;
  const baselineRuns = [0, 1, 2, 3, 4].map(() => timed(() => typedRanking(typed, end, 3)));
  // As the portfolio's worker ranks (workers/portfolio-ranking.worker.ts): without trend lines, into the list's
  // columns it sends the page, then the lines of the rows on screen.
  const asTheAppRanks = (profiles: typeof BUILT_IN_PROFILES, options: RankingOptions, of = records) => {
    const list = listColumnsOf(rankedPortfolio(of, profiles, { ...options, trendMonths: 0 }));
    return processTrends(of, profiles, list.processIds.slice(0, ON_SCREEN), options);
  };
  return {
    records,
    statistics,
    typed,
    end,
    buildMs,
    baselineRuns,
    baseline: median(baselineRuns),
    asTheAppRanks
  };
}

/** What one fresh process (or browser worker) measures of a first ranking. */
export interface FirstRanking {
  first: number;
  /** The same computation again with the code warm (firstRankingAgain). */
  again: number;
  baseline: number;
  baselineFirst: number;
}

/**
 * The first ranking alone, in this process (or worker): what the fresh processes of runRankingBench and the fresh
 * browsers of the browser bench each measure.
 */
export function firstRankingInThisProcess(size: number): FirstRanking {
  const { records, asTheAppRanks, end, baseline, baselineRuns } = preparedScale(size);
  const cache: FiguresCache = new WindowFiguresCache();
  const options = { endPeriod: addMonths(BENCH_FIRST_PERIOD, end), windowMonths: 3, cache };
  const first = timed(() => asTheAppRanks(BUILT_IN_PROFILES, options));
  const again = firstRankingAgain(records, asTheAppRanks, options);
  return { first, again, baseline, baselineFirst: baselineRuns[0]! };
}

/** The record arrays of a portfolio copied (the records themselves shared): to the ranking, a new record set. */
function newRecordArrays(records: PortfolioRecords): Omit<PortfolioRecords, 'studies' | 'statistics'> {
  return {
    sites: [...records.sites],
    processes: [...records.processes],
    characteristics: [...records.characteristics],
    projects: [...records.projects]
  };
}

/**
 * The first computation again, after it, on new record arrays and an empty figures cache: nothing of the first is
 * kept (plan, prepared windows, window figures), but the code has run — as it has for the baseline's median,
 * which the first computation is measured against. Median of three.
 */
export function firstRankingAgain(
  records: PortfolioRecords,
  asTheAppRanks: ReturnType<typeof preparedScale>['asTheAppRanks'],
  options: RankingOptions
): number {
  (globalThis as { gc?: () => void }).gc?.();
  return median(
    [0, 1, 2].map(() => {
      const copy = { ...records, ...newRecordArrays(records) };
      return timed(() =>
        asTheAppRanks(BUILT_IN_PROFILES, { ...options, cache: new WindowFiguresCache() }, copy)
      );
    })
  );
}

export function timed(fn: () => unknown): number {
  const t = performance.now();
  fn();
  return performance.now() - t;
}
