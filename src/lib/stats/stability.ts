import { c4, d2, d3 } from './control-chart-constants';
import { mean, sampleVariance } from './moments';

/**
 * Control-chart limits and run rules for judging whether a study's process was stable.
 *
 * Charts (Montgomery, Introduction to Statistical Quality Control, 6th ed., §6.2–6.4):
 * - individuals: centre x̄, limits x̄ ± 3·MR̄/d2(2); moving-range chart UCL = D4(2)·MR̄ = 3.267·MR̄;
 * - subgroups of size n: X̄ chart with centre x̿ and limits x̿ ± 3σ̂/√n (σ̂ the within sigma); R chart limits
 *   D3·R̄, D4·R̄ with D3 = max(0, 1 − 3d3/d2), D4 = 1 + 3d3/d2 (n ≤ 10), or S chart limits
 *   S̄·(1 ∓ 3√(1 − c4²)/c4) (n > 10).
 * Rules (Nelson 1984, Journal of Quality Technology 16(4), tests 1–3):
 *   1. a point beyond a 3σ limit; 2. nine points in a row on one side of the centre line;
 *   3. six points in a row steadily increasing or decreasing.
 */
export type ChartKind = 'individuals' | 'xbar-r' | 'xbar-s';

export interface RuleSignal {
  rule: 1 | 2 | 3;
  chart: 'location' | 'spread';
  /** Index of the point (or of the last point of the run) in the plotted sequence. */
  index: number;
}

export interface StabilityResult {
  chart: ChartKind;
  centre: number;
  lcl: number;
  ucl: number;
  spreadCentre: number;
  spreadUcl: number;
  spreadLcl: number;
  points: number;
  signals: RuleSignal[];
  /** Count of each rule's signals (the list itself is capped). */
  counts: { rule1: number; rule2: number; rule3: number; spread: number };
  stable: boolean;
  description: string;
}

const MAX_LISTED = 50;

function runRules(
  series: ArrayLike<number>,
  centre: number,
  lcl: number,
  ucl: number,
  signals: RuleSignal[],
  counts: StabilityResult['counts']
): void {
  let sideRun = 0;
  let lastSide = 0;
  let trendRun = 1;
  let lastDirection = 0;
  for (let i = 0; i < series.length; i += 1) {
    const x = series[i] as number;
    if (x > ucl || x < lcl) {
      counts.rule1 += 1;
      if (signals.length < MAX_LISTED) signals.push({ rule: 1, chart: 'location', index: i });
    }
    const side = x > centre ? 1 : x < centre ? -1 : 0;
    sideRun = side !== 0 && side === lastSide ? sideRun + 1 : side !== 0 ? 1 : 0;
    lastSide = side;
    if (sideRun === 9) {
      counts.rule2 += 1;
      if (signals.length < MAX_LISTED) signals.push({ rule: 2, chart: 'location', index: i });
    }
    if (i > 0) {
      const prev = series[i - 1] as number;
      const direction = x > prev ? 1 : x < prev ? -1 : 0;
      trendRun = direction !== 0 && direction === lastDirection ? trendRun + 1 : direction !== 0 ? 2 : 1;
      lastDirection = direction;
      // Six points in a row steadily moving: five steps in one direction.
      if (trendRun === 6) {
        counts.rule3 += 1;
        if (signals.length < MAX_LISTED) signals.push({ rule: 3, chart: 'location', index: i });
      }
    }
  }
}

function spreadSignals(
  series: ArrayLike<number>,
  lcl: number,
  ucl: number,
  signals: RuleSignal[],
  counts: StabilityResult['counts']
): void {
  for (let i = 0; i < series.length; i += 1) {
    const v = series[i] as number;
    if (v > ucl || v < lcl) {
      counts.spread += 1;
      if (signals.length < MAX_LISTED) signals.push({ rule: 1, chart: 'spread', index: i });
    }
  }
}

/**
 * What a chart plots, in the order its limits and signals (RuleSignal.index) refer to: the location points
 * (the values, or the means of subgroups of 2 or more) and the spread points (moving ranges |xᵢ − xᵢ₋₁|, or each
 * subgroup's range or sample standard deviation, as `chart` says). The same arithmetic the limits rest on.
 */
export function controlChartSeries(
  values: ArrayLike<number>,
  groups: readonly number[][] | undefined,
  chart: ChartKind
): { location: number[]; spread: number[] } {
  if (chart === 'individuals') {
    const location = Array.from(values);
    return { location, spread: location.slice(1).map((v, i) => Math.abs(v - location[i]!)) };
  }
  const usable = (groups ?? []).filter((g) => g.length >= 2);
  return {
    location: usable.map((g) => mean(g)),
    spread: usable.map((g) =>
      chart === 'xbar-r' ? Math.max(...g) - Math.min(...g) : Math.sqrt(sampleVariance(g))
    )
  };
}

/** Individuals and moving-range chart of values in time order. Needs at least 3 values. */
export function individualsStability(values: ArrayLike<number>, knownMean?: number): StabilityResult {
  const n = values.length;
  if (n < 3) throw new RangeError('At least 3 values are needed for an individuals control chart');
  const centre = knownMean ?? mean(values);
  let sum = 0;
  for (let i = 1; i < n; i += 1) sum += Math.abs((values[i] as number) - (values[i - 1] as number));
  const mrBar = sum / (n - 1);
  const sigma = mrBar / d2(2);
  const signals: RuleSignal[] = [];
  const counts = { rule1: 0, rule2: 0, rule3: 0, spread: 0 };
  const lcl = centre - 3 * sigma;
  const ucl = centre + 3 * sigma;
  runRules(values, centre, lcl, ucl, signals, counts);
  const spreadUcl = 3.267 * mrBar;
  // Moving ranges recomputed rather than stored: a million-value study should not need another array.
  for (let i = 1; i < n; i += 1) {
    if (Math.abs((values[i] as number) - (values[i - 1] as number)) > spreadUcl) {
      counts.spread += 1;
      if (signals.length < MAX_LISTED) signals.push({ rule: 1, chart: 'spread', index: i - 1 });
    }
  }
  return finish('individuals', centre, lcl, ucl, mrBar, 0, spreadUcl, n, signals, counts);
}

/** X̄–R (subgroups up to 10) or X̄–S chart of subgroups in time order, with the within sigma given. */
export function subgroupStability(groups: readonly number[][], sigmaWithin: number): StabilityResult {
  const usable = groups.filter((g) => g.length >= 2);
  if (usable.length < 3)
    throw new RangeError('At least 3 subgroups of 2 or more values are needed for a subgroup control chart');
  const size = Math.round(usable.reduce((a, g) => a + g.length, 0) / usable.length);
  const d3n = d3(size);
  const chart: ChartKind = size <= 10 && d3n !== undefined ? 'xbar-r' : 'xbar-s';
  const { location: means, spread } = controlChartSeries([], usable, chart);
  const centre = mean(means);
  const half = (3 * sigmaWithin) / Math.sqrt(size);
  const signals: RuleSignal[] = [];
  const counts = { rule1: 0, rule2: 0, rule3: 0, spread: 0 };
  runRules(means, centre, centre - half, centre + half, signals, counts);
  let factorLow: number;
  let factorHigh: number;
  if (chart === 'xbar-r') {
    const factor = (3 * d3n!) / d2(size);
    factorLow = Math.max(0, 1 - factor);
    factorHigh = 1 + factor;
  } else {
    const c = c4(size);
    const k = (3 * Math.sqrt(1 - c * c)) / c;
    factorLow = Math.max(0, 1 - k);
    factorHigh = 1 + k;
  }
  const spreadBar = mean(spread);
  spreadSignals(spread, factorLow * spreadBar, factorHigh * spreadBar, signals, counts);
  return finish(
    chart,
    centre,
    centre - half,
    centre + half,
    spreadBar,
    factorLow * spreadBar,
    factorHigh * spreadBar,
    usable.length,
    signals,
    counts
  );
}

function finish(
  chart: ChartKind,
  centre: number,
  lcl: number,
  ucl: number,
  spreadCentre: number,
  spreadLcl: number,
  spreadUcl: number,
  points: number,
  signals: RuleSignal[],
  counts: StabilityResult['counts']
): StabilityResult {
  const total = counts.rule1 + counts.rule2 + counts.rule3 + counts.spread;
  const chartName =
    chart === 'individuals'
      ? 'individuals and moving-range chart'
      : chart === 'xbar-r'
        ? 'X̄ and R chart'
        : 'X̄ and S chart';
  const description =
    total === 0
      ? `No signal on the ${chartName} (${points} points; Nelson tests 1–3)`
      : `${total} signal${total === 1 ? '' : 's'} on the ${chartName}: ${counts.rule1} beyond 3σ, ${counts.rule2} runs of nine on one side, ${counts.rule3} trends of six, ${counts.spread} spread points beyond limits`;
  return {
    chart,
    centre,
    lcl,
    ucl,
    spreadCentre,
    spreadLcl,
    spreadUcl,
    points,
    signals,
    counts,
    stable: total === 0,
    description
  };
}
