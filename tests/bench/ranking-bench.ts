/**
 * The ranking and the quarterly review at company size: 2 000, 5 000 and 20 000 processes × 36 months of
 * generated studies, each size in a process of its own so that its peak memory is its own. Every row stands
 * beside the typed-array baseline (typed-array-baseline.ts) measured in the same process. Prints only.
 *
 * The records pass through JSON before they are ranked: that is how the app receives them (from IndexedDB or
 * a file), and strings built by template literals are slower to compare than parsed ones, which would flatter
 * or blame the code for the generator's doing.
 */
import { WindowFiguresCache } from '../../src/lib/domain/window-figures-cache';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Characteristic } from '../../src/lib/domain/characteristic';
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { PROJECT_PHASES, type ImprovementProject } from '../../src/lib/domain/improvement-project';
import { addMonths } from '../../src/lib/domain/period';
import {
  DEFAULT_WEIGHTS,
  processTrends,
  rankedPortfolio,
  rankPortfolio,
  type FiguresCache,
  type PortfolioRecords,
  type RankingOptions
} from '../../src/lib/domain/portfolio-ranking';
import { MonthlyStatistics } from '../../src/lib/domain/monthly-statistics';
import { listColumnsOf } from '../../src/lib/domain/portfolio-list-of-ranking';
import { listRowAt } from '../../src/lib/domain/portfolio-list-columns';
import type { Process } from '../../src/lib/domain/process';
import { buildQuarterReview } from '../../src/lib/domain/quarter-review';
import type { Study } from '../../src/lib/domain/study';
import type { BenchRow } from './engine-bench';
import { snapshotOf, storedForm } from '../../src/lib/storage/portfolio-reader';
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

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
}

const fmt = (n: number) => n.toLocaleString('en-GB').replace(/,/g, ' ');

const MONTHS = 36;
/** A tall window shows some 30 rows of the list; their trend lines are drawn as they come into view. */
const ON_SCREEN = 40;

/**
 * A portfolio of `size` processes generated into the read model and the baseline's arrays, the baseline timed
 * five times (its median is what every ranking row is measured against; its first run, cold as the ranking's
 * first computation is, is kept beside it), and the ranking as the app's worker does it.
 */
function preparedScale(size: number) {
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

/** The record arrays of a portfolio copied (the records themselves shared): to the ranking, a new record set. */
function newRecordArrays(records: PortfolioRecords): Omit<PortfolioRecords, 'studies' | 'statistics'> {
  return {
    sites: [...records.sites],
    processes: [...records.processes],
    characteristics: [...records.characteristics],
    projects: [...records.projects]
  };
}

/** What one fresh process measures of a first ranking (firstRankingInFreshProcess). */
interface FirstRanking {
  first: number;
  baseline: number;
  baselineFirst: number;
}

/** The first ranking alone, in this process: what the fresh processes of runRankingBench each measure. */
function firstRankingInThisProcess(size: number): FirstRanking {
  const { asTheAppRanks, end, baseline, baselineRuns } = preparedScale(size);
  const cache: FiguresCache = new WindowFiguresCache();
  const options = { endPeriod: addMonths(BENCH_FIRST_PERIOD, end), windowMonths: 3, cache };
  const first = timed(() => asTheAppRanks(BUILT_IN_PROFILES, options));
  return { first, baseline, baselineFirst: baselineRuns[0]! };
}

/** Every row of one size, measured in this process. */
export function measureScale(size: number): BenchRow[] {
  const months = MONTHS;
  const { records, statistics, typed, end, buildMs, baselineRuns, baseline, asTheAppRanks } =
    preparedScale(size);
  // The review ranks ten quarters (eight for the trend, the year-ago one, and the one before the projects).
  const reviewBaseline = median(
    [0, 1, 2].map(() =>
      timed(() => [0, 3, 6, 9, 12, 15, 18, 21, 24, 27].map((q) => typedRanking(typed, end - q, 3)))
    )
  );
  const onScreen = ON_SCREEN;
  const cache: FiguresCache = new WindowFiguresCache();
  const options = { endPeriod: addMonths(BENCH_FIRST_PERIOD, end), windowMonths: 3, cache };
  const first = timed(() => asTheAppRanks(BUILT_IN_PROFILES, options));
  const stricter = BUILT_IN_PROFILES.map((p) => ({
    ...p,
    levels: { ...p.levels, standard: p.levels.standard * 1.1 }
  }));
  const again = median(
    [0, 1, 2, 3, 4].map((i) => timed(() => asTheAppRanks(i % 2 ? BUILT_IN_PROFILES : stricter, options)))
  );
  // One context's target changed (as a person edits one): only its processes are judged again.
  const oneStricter = BUILT_IN_PROFILES.map((p, i) => (i === 0 ? stricter[0]! : p));
  const oneContext = median(
    [0, 1, 2, 3, 4].map((i) => timed(() => asTheAppRanks(i % 2 ? BUILT_IN_PROFILES : oneStricter, options)))
  );
  // A change of weights alone: nothing is judged again (the rows judged under the same profiles are kept).
  asTheAppRanks(BUILT_IN_PROFILES, options);
  const reweighted = median(
    [0, 1, 2, 3, 4].map((i) =>
      timed(() =>
        asTheAppRanks(BUILT_IN_PROFILES, {
          ...options,
          weights: { ...DEFAULT_WEIGHTS, cost: DEFAULT_WEIGHTS.cost * (1 + (i % 2)) }
        })
      )
    )
  );
  const reviewCache: FiguresCache = new WindowFiguresCache();
  const quarter = '2026-Q4';
  const reviewFirst = timed(() =>
    buildQuarterReview(records, BUILT_IN_PROFILES, { quarter, cache: reviewCache })
  );
  const reviewAgain = timed(() =>
    buildQuarterReview(records, BUILT_IN_PROFILES, { quarter, cache: reviewCache })
  );
  // A person stepping back one quarter: seven of its eight trend quarters were judged for the review above.
  const reviewStepBack = timed(() =>
    buildQuarterReview(records, BUILT_IN_PROFILES, { quarter: '2026-Q3', cache: reviewCache })
  );
  // Peak resident memory of the ranking and the review, before the restore below adds its copies.
  const peakMB = process.resourceUsage().maxRSS / 1024;
  // As the worker restores it: the stored form cloned (what IndexedDB does) and turned back into a model —
  // measured last, so that its copies are not part of the ranking's and the review's peak memory.
  const restoreMs = timed(() =>
    MonthlyStatistics.fromSnapshot(
      snapshotOf(structuredClone(storedForm(statistics.snapshot(), 0))),
      new Map()
    )
  );
  const restorePeakMB = process.resourceUsage().maxRSS / 1024;
  // As the command line ranks: every row with its trend line, on a cache of its own (last: its prepared windows
  // are kept beside the app's, which no real use does).
  const withEveryTrend = timed(() =>
    rankPortfolio(records, BUILT_IN_PROFILES, { ...options, cache: new WindowFiguresCache() })
  );
  const everyTrendPeakMB = process.resourceUsage().maxRSS / 1024;
  // What the page receives (workers/portfolio-ranking.worker.ts): the list's columns, copied as postMessage copies
  // them, beside the same list as one object per row (what the worker sent before the columns). Last: the copies
  // of the rows would count in the peak of every row measured after them.
  const list = listColumnsOf(rankedPortfolio(records, BUILT_IN_PROFILES, { ...options, trendMonths: 0 }));
  const listAsRows = Array.from({ length: list.count }, (_, i) => listRowAt(list, i));
  const listCopy = median([0, 1, 2].map(() => timed(() => structuredClone(list))));
  const rowsCopy = median([0, 1, 2].map(() => timed(() => structuredClone(listAsRows))));
  const listPeakMB = process.resourceUsage().maxRSS / 1024;
  // The same first computation again, in this process, on new record arrays and an empty figures cache: nothing
  // of the first is kept (plan, prepared windows, window figures), but the code has run — as it has for the
  // baseline's median, which the first computation is measured against. Last, so that the peak memory of the
  // rows above is not raised by what these three leave for the collector.
  (globalThis as { gc?: () => void }).gc?.();
  const firstWarm = median(
    [0, 1, 2].map(() => {
      const copy = { ...records, ...newRecordArrays(records) };
      return timed(() =>
        asTheAppRanks(BUILT_IN_PROFILES, { ...options, cache: new WindowFiguresCache() }, copy)
      );
    })
  );
  const label = `${fmt(size)} processes × ${months} months`;
  const base = { size, baselineName: 'typed-array loop, one ranking', baselineMs: baseline };
  const reviewBase = { size, baselineName: 'typed-array loop, ten rankings', baselineMs: reviewBaseline };
  const rows: BenchRow[] = [
    { name: `read model ${label}: built from every study, a page at a time`, ms: buildMs, size },
    {
      name: `typed-array baseline ${label}: its first run (cold, as a first computation is), beside the median of its five`,
      ms: baselineRuns[0]!,
      size,
      baselineName: 'typed-array loop, one ranking',
      baselineMs: baseline
    },
    {
      name: `ranking ${label}, first computation from the read model (the list's columns; trend lines of the ${onScreen} rows on screen), in this process`,
      ms: first,
      ...base,
      // At the size the target names, the median of fresh processes (runRankingBench) carries it: one first run
      // moves with whatever else the machine does in that second.
      ...(size === FRESH_SIZE ? {} : { target: '≤ 10×' })
    },
    {
      name: `ranking ${label}, recompute after a target change (and the ${onScreen} rows' trend lines)`,
      ms: again,
      ...base,
      target: '≤ 3×'
    },
    {
      name: `ranking ${label}, recompute after one of the ${BUILT_IN_PROFILES.length} contexts' target changes (and the ${onScreen} rows' trend lines)`,
      ms: oneContext,
      ...base
    },
    {
      name: `ranking ${label}, recompute after a change of weights (and the ${onScreen} rows' trend lines)`,
      ms: reweighted,
      ...base
    },
    { name: `quarterly review ${label}, first computation`, ms: reviewFirst, ...reviewBase, target: '≤ 10×' },
    {
      name: `quarterly review ${label}, again (window figures and quarter standings kept)`,
      ms: reviewAgain,
      ...reviewBase
    },
    {
      name: `quarterly review ${label}, then the quarter before (as a person steps back)`,
      ms: reviewStepBack,
      ...reviewBase
    }
  ];
  return [
    ...rows.map((r) => ({ ...r, peakMB })),
    {
      name: `read model ${label}: restored from its stored form (peak: with the stored copies)`,
      ms: restoreMs,
      size,
      peakMB: restorePeakMB
    },
    {
      name: `ranking ${label}, first computation with every row's trend line (as the command line prints it; peak: beside the rest)`,
      ms: withEveryTrend,
      ...base,
      peakMB: everyTrendPeakMB
    },
    {
      name: `portfolio list ${label}: copied to the page as the worker sends it (structured clone of the list's columns; peak: with the copies)`,
      ms: listCopy,
      size,
      baselineName: 'the same list as one object per row',
      baselineMs: rowsCopy,
      peakMB: listPeakMB
    },
    {
      name: `ranking ${label}, the first computation again on new record arrays and an empty cache (nothing kept, the code warm as for the baseline's median; median of 3; measured last)`,
      ms: firstWarm,
      ...base,
      peakMB: process.resourceUsage().maxRSS / 1024
    }
  ];
}

function timed(fn: () => unknown): number {
  const t = performance.now();
  fn();
  return performance.now() - t;
}

/**
 * Runs each size in a child process and adds that process's peak resident memory to its rows. The child runs this
 * file compiled to one JavaScript bundle by esbuild (as the command line ships), not through the TypeScript
 * loader: the loader's own thread and caches added some 40 MB to every peak, memory the app never spends.
 */
export async function runRankingBench(sizes: readonly number[] = [2000, 5000, 20000]): Promise<BenchRow[]> {
  const self = fileURLToPath(import.meta.url);
  const bundle = fileURLToPath(
    new URL('../../node_modules/.cache/capstan-bench/ranking-bench.mjs', import.meta.url)
  );
  const { build } = await import('esbuild');
  await build({
    entryPoints: [self],
    outfile: bundle,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    logLevel: 'error'
  });
  const run = (args: string[]) => {
    const child = spawnSync(process.execPath, ['--expose-gc', bundle, ...args], {
      encoding: 'utf8',
      maxBuffer: 1 << 24
    });
    if (child.status !== 0)
      throw new Error(`ranking bench ${args.join(' ')} failed: ${child.stderr.slice(-300)}`);
    return JSON.parse(child.stdout.trim().split('\n').pop()!) as unknown;
  };
  const rows = sizes.flatMap((size) => {
    try {
      return run([String(size)]) as BenchRow[];
    } catch (e) {
      return [{ name: `ranking and review at ${size}: ${(e as Error).message}`, size, ms: NaN }];
    }
  });
  if (!sizes.includes(FRESH_SIZE)) return rows;
  // The first ranking again in fresh processes, each cold and against its own baseline: the row the target names.
  const firsts: FirstRanking[] = [];
  for (let i = 0; i < FRESH_PROCESSES; i += 1) {
    try {
      firsts.push(run([String(FRESH_SIZE), 'first']) as FirstRanking);
    } catch (e) {
      return [
        ...rows,
        { name: `first ranking at ${FRESH_SIZE} in a fresh process: ${(e as Error).message}`, ms: NaN }
      ];
    }
  }
  const ratios = firsts.map((f) => f.first / f.baseline).sort((a, b) => a - b);
  const coldRatios = firsts.map((f) => f.first / f.baselineFirst).sort((a, b) => a - b);
  const range = (xs: number[], digits: number, unit: string) =>
    `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}${unit}`;
  const label = `${fmt(FRESH_SIZE)} processes × ${MONTHS} months`;
  const firstMs = firsts.map((f) => f.first);
  return [
    ...rows,
    {
      name: `ranking ${label}, first computation as above, median of ${FRESH_PROCESSES} fresh processes (runs ${range(firstMs, 0, ' ms')}; each against its own process's baseline median: ${range(ratios, 1, '×')})`,
      size: FRESH_SIZE,
      ms: median(firstMs),
      baselineName: 'typed-array loop, one ranking (median of the processes’ medians)',
      baselineMs: median(firsts.map((f) => f.baseline)),
      target: '≤ 10×'
    },
    {
      name: `ranking ${label}, the same ${FRESH_PROCESSES} first computations against the baseline's own first (cold) run in each process (${range(coldRatios, 1, '×')})`,
      size: FRESH_SIZE,
      ms: median(firstMs),
      baselineName: 'typed-array loop, its first run (median of the processes’)',
      baselineMs: median(firsts.map((f) => f.baselineFirst))
    }
  ];
}

/** The size whose first ranking is measured again in fresh processes, and how many. */
const FRESH_SIZE = 20000;
const FRESH_PROCESSES = 5;

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const size = Number(process.argv[2] ?? 2000);
  if (process.argv[3] === 'first') console.log(JSON.stringify(firstRankingInThisProcess(size)));
  else {
    const rows = measureScale(size);
    const peakMB = process.resourceUsage().maxRSS / 1024;
    console.log(JSON.stringify(rows.map((r) => ({ ...r, peakMB: r.peakMB ?? peakMB }))));
  }
}
