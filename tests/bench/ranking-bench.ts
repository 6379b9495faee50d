/**
 * The ranking and the quarterly review at company size: 2 000, 5 000 and 20 000 processes × 36 months of
 * generated studies, each size in a process of its own so that its peak memory is its own. Every row stands
 * beside the typed-array baseline (typed-array-baseline.ts) measured in the same process. Prints only.
 *
 * The records pass through JSON before they are ranked: that is how the app receives them (from IndexedDB or
 * a file), and strings built by template literals are slower to compare than parsed ones, which would flatter
 * or blame the code for the generator's doing.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { WindowFiguresCache } from '../../src/lib/domain/window-figures-cache';
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { addMonths } from '../../src/lib/domain/period';
import {
  DEFAULT_WEIGHTS,
  rankPortfolio,
  rankedPortfolio,
  type FiguresCache
} from '../../src/lib/domain/portfolio-ranking';
import { MonthlyStatistics } from '../../src/lib/domain/monthly-statistics';
import { listColumnsOf } from '../../src/lib/domain/portfolio-list-of-ranking';
import { listRowAt } from '../../src/lib/domain/portfolio-list-columns';
import { buildQuarterReview } from '../../src/lib/domain/quarter-review';
import type { BenchRow } from './engine-bench';
import { snapshotOf, storedForm } from '../../src/lib/storage/portfolio-reader';
import {
  BENCH_FIRST_PERIOD,
  firstRankingAgain,
  firstRankingInThisProcess,
  median,
  MONTHS,
  ON_SCREEN,
  preparedScale,
  spanOf,
  timed,
  type FirstRanking
} from './ranking-scale';
import { typedRanking } from './typed-array-baseline';

const fmt = (n: number) => n.toLocaleString('en-GB').replace(/,/g, ' ');

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
  // The same first computation again with the code warm (firstRankingAgain). Last, so that the peak memory of
  // the rows above is not raised by what its three runs leave for the collector.
  const firstWarm = firstRankingAgain(records, asTheAppRanks, options);
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
  const label = `${fmt(FRESH_SIZE)} processes × ${MONTHS} months`;
  const firstMs = firsts.map((f) => f.first);
  return [
    ...rows,
    {
      name: `ranking ${label}, first computation as above, median of ${FRESH_PROCESSES} fresh processes (runs ${spanOf(firstMs, 0, ' ms')}; each against its own process's baseline median: ${spanOf(ratios, 1, '×')})`,
      size: FRESH_SIZE,
      ms: median(firstMs),
      baselineName: 'typed-array loop, one ranking (median of the processes’ medians)',
      baselineMs: median(firsts.map((f) => f.baseline)),
      target: '≤ 10×'
    },
    {
      name: `ranking ${label}, the same ${FRESH_PROCESSES} first computations against the baseline's own first (cold) run in each process (${spanOf(coldRatios, 1, '×')})`,
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
