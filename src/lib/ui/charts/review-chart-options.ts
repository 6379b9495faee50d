import { firstInOrder } from '../../domain/first-in-order';
import { formatIndex } from '../../domain/figure-format';
import type { EChartsCoreOption } from 'echarts/core';
import type { ReviewFigures, ReviewProcessLine } from '../../domain/review-figures';

/**
 * Chart options of the quarterly review: pure functions of the review figures, unit-tested without a
 * browser. Names come from people's data; ChartPanel draws tooltips as chart text, never as HTML.
 */
const SHORT = '#b5462f';
const MEETS = '#2f6f4e';
const TARGET = '#1f3a4d';
const MUTED = '#9aa7b0';

const base = {
  aria: { enabled: true },
  animation: false
};

/**
 * A scatter of one point per process is drawn as one path once it has more than a few hundred points: at
 * company size (2 000 processes) an SVG element per point made drawing one chart a task of 0.3–0.4 s on a
 * slow machine. Below the threshold each point stays an element of its own, as before. (ECharts draws a large
 * series in parts over several frames only on a canvas, never in SVG: the whole path is one task.)
 */
const MANY_POINTS = { large: true, largeThreshold: 400 };

/**
 * A scatter's points as ECharts reads them fastest: past the one-path threshold, one Float64Array of x, y pairs.
 * Reading 20 000 points given one object or array each was half of drawing such a chart (Chromium, 20 000
 * points, warm: 95 → 46 ms for the movement chart, 60 → 43 ms for the sites chart; cold, as a page's first
 * drawing is, 223 → 121 and 101 → 62 ms). Below the threshold each point stays an array of its own.
 */
export function scatterPoints<T>(
  items: readonly T[],
  xy: (item: T) => [number, number]
): unknown[] | Float64Array {
  if (items.length <= MANY_POINTS.largeThreshold) return items.map(xy);
  const pairs = new Float64Array(items.length * 2);
  items.forEach((item, i) => {
    const [x, y] = xy(item);
    pairs[2 * i] = x;
    pairs[2 * i + 1] = y;
  });
  return pairs;
}

/** Bars a chart can show legibly; beyond it the chart shows the weakest ones and says so. */
export const MAX_PROCESS_BARS = 40;

/** The processes the z-level chart draws: judged ones, weakest (most negative gap) first, at most `limit`. */
export function weakestJudged(
  lines: readonly ReviewProcessLine[],
  limit = MAX_PROCESS_BARS
): ReviewProcessLine[] {
  return firstInOrder(
    lines,
    limit,
    (a, b) => (a.zGap ?? 0) - (b.zGap ?? 0) || a.processId.localeCompare(b.processId),
    (l) => l.zLevel !== undefined && Number.isFinite(l.zLevel)
  );
}

/**
 * z-level of each process with its required level, weakest first. Short and meeting processes are two series
 * (stacked, one bar per row), so that the legend's colours are the bars' colours.
 */
export function zAgainstTargetOption(lines: readonly ReviewProcessLine[]): EChartsCoreOption {
  const rows = weakestJudged(lines);
  const label = (l: ReviewProcessLine) => `${l.process} · ${l.site}`;
  const bars = (name: string, short: boolean, color: string) => ({
    type: 'bar',
    name,
    stack: 'z',
    itemStyle: { color },
    data: rows.map((l) => ((l.status === 'short') === short ? round(l.zLevel!) : '-'))
  });
  return {
    ...base,
    grid: { left: 8, right: 24, top: 28, bottom: 24, containLabel: true },
    legend: { top: 0, data: ['short', 'meeting target', 'required'] },
    tooltip: { trigger: 'axis' },
    xAxis: {
      type: 'value',
      name: 'z-level',
      nameLocation: 'middle',
      nameGap: 24,
      min: (v: { min: number }) => Math.min(0, Math.floor(v.min)),
      // The required levels are in view, not only the bars.
      max: (v: { max: number }) =>
        Math.ceil(Math.max(v.max, ...rows.map((l) => l.requiredZ ?? -Infinity)) + 0.5)
    },
    yAxis: {
      type: 'category',
      data: rows.map(label),
      inverse: true,
      axisLabel: { width: 260, overflow: 'truncate' }
    },
    series: [
      bars('short', true, SHORT),
      bars('meeting target', false, MEETS),
      {
        type: 'scatter',
        name: 'required',
        symbol: 'rect',
        symbolSize: [3, 14],
        itemStyle: { color: TARGET },
        data: rows.map((l) => (l.requiredZ === undefined ? null : round(l.requiredZ)))
      }
    ]
  };
}

/** Cost of poor quality per year, largest first, with the cumulative share: one currency per chart. */
export function costParetoOption(lines: readonly ReviewProcessLine[], currency: string): EChartsCoreOption {
  const rows = paretoRows(lines, currency);
  return {
    ...base,
    // The axis names (currency, %) sit above the plot: the legend keeps to one line (paged when narrow) and the
    // plot starts below both, so that on a phone the legend's second line no longer covers the names.
    grid: { left: 8, right: 48, top: 52, bottom: 8, containLabel: true },
    legend: { top: 0, type: 'scroll', data: [`cost per year (${currency})`, 'cumulative share'] },
    tooltip: { trigger: 'axis' },
    xAxis: {
      type: 'category',
      data: rows.map((r) => r.process),
      axisLabel: { rotate: 40, width: 120, overflow: 'truncate' }
    },
    yAxis: [
      { type: 'value', name: currency },
      { type: 'value', name: '%', max: 100, min: 0 }
    ],
    series: [
      {
        type: 'bar',
        name: `cost per year (${currency})`,
        data: rows.map((r) => Math.round(r.cost)),
        itemStyle: { color: SHORT }
      },
      {
        type: 'line',
        name: 'cumulative share',
        yAxisIndex: 1,
        data: rows.map((r) => round(r.cumulative * 100, 1)),
        itemStyle: { color: TARGET }
      }
    ]
  };
}

export function paretoRows(lines: readonly ReviewProcessLine[], currency: string, limit = MAX_PROCESS_BARS) {
  const counted = (l: ReviewProcessLine) => l.currency === currency && (l.costPerYear ?? 0) > 0;
  const rows = firstInOrder(
    lines,
    limit,
    (a, b) => (b.costPerYear ?? 0) - (a.costPerYear ?? 0) || a.processId.localeCompare(b.processId),
    counted
  );
  let total = 0;
  for (const l of lines) if (counted(l)) total += l.costPerYear ?? 0;
  let running = 0;
  return rows.map((l) => {
    running += l.costPerYear ?? 0;
    return {
      process: `${l.process} · ${l.site}`,
      cost: l.costPerYear ?? 0,
      cumulative: total > 0 ? running / total : 0
    };
  });
}

/** Each process's z-level last quarter against this quarter; above the diagonal improved. */
export function movementOption(figures: ReviewFigures): EChartsCoreOption {
  const all = figures.movers;
  // A loop, not Math.min(...values): two values per process as arguments overflow the stack at some 100 000.
  let least = 0;
  let most = 1;
  for (const m of all)
    for (const v of [m.zBefore, m.zAfter])
      if (Number.isFinite(v)) {
        if (v < least) least = v;
        if (v > most) most = v;
      }
  const lo = Math.floor(least);
  const hi = Math.ceil(most);
  const beyond = all.filter((m) => m.beyondNoise);
  const within = all.filter((m) => !m.beyondNoise);
  const point = (m: ReviewFigures['movers'][number]): [number, number] => [round(m.zBefore), round(m.zAfter)];
  // The points carry no names (scatterPoints): the tooltip finds the process by its series and place, and writes
  // its z-levels as the table beside the chart does.
  const named = [beyond, within];
  const tooltip = (p: { seriesIndex?: number; dataIndex?: number }) => {
    const m = named[p.seriesIndex ?? -1]?.[p.dataIndex ?? -1];
    return m
      ? `${m.process} · ${m.site}\n${figures.previousQuarter}: ${formatIndex(m.zBefore)}   ${figures.quarter}: ${formatIndex(m.zAfter)}`
      : '';
  };
  return {
    ...base,
    // The across quarter is named below its axis: at its end, the name ran off the chart on a phone.
    grid: { left: 8, right: 24, top: 28, bottom: 28, containLabel: true },
    legend: { top: 0, data: ['more than noise', 'within noise'] },
    tooltip: { trigger: 'item', formatter: tooltip },
    xAxis: {
      type: 'value',
      name: figures.previousQuarter,
      nameLocation: 'middle',
      nameGap: 24,
      min: lo,
      max: hi
    },
    yAxis: { type: 'value', name: figures.quarter, min: lo, max: hi },
    series: [
      {
        type: 'scatter',
        name: 'more than noise',
        ...MANY_POINTS,
        itemStyle: { color: SHORT },
        data: scatterPoints(beyond, point),
        markLine: {
          silent: true,
          symbol: 'none',
          lineStyle: { color: MUTED, type: 'dashed' },
          data: [[{ coord: [lo, lo] }, { coord: [hi, hi] }]]
        }
      },
      {
        type: 'scatter',
        name: 'within noise',
        ...MANY_POINTS,
        itemStyle: { color: MUTED },
        data: scatterPoints(within, point)
      }
    ]
  };
}

/**
 * The z-levels of each site's processes as points, with the site's median: sites down the side, one band each
 * (siteBandsHeight), so that every site is named — across the chart, 50 sites left room for a few names at most,
 * and on a phone for the first and the last.
 */
export function siteDistributionOption(figures: ReviewFigures): EChartsCoreOption {
  const sites = figures.sites;
  return {
    ...base,
    grid: { left: 8, right: 24, top: 28, bottom: 24, containLabel: true },
    legend: { top: 0, data: ['process', 'median'] },
    tooltip: { trigger: 'item' },
    xAxis: { type: 'value', name: 'z-level', nameLocation: 'middle', nameGap: 24 },
    yAxis: {
      type: 'category',
      data: sites.map((s) => s.site),
      inverse: true,
      axisLabel: { width: 160, overflow: 'truncate', interval: 0 }
    },
    series: [
      {
        type: 'scatter',
        name: 'process',
        ...MANY_POINTS,
        symbolSize: 8,
        itemStyle: { color: TARGET, opacity: 0.7 },
        data: scatterPoints(
          sites.flatMap((s, i) => s.zLevels.map((z): [number, number] => [round(z), i])),
          (p) => p
        )
      },
      {
        type: 'scatter',
        name: 'median',
        symbol: 'rect',
        symbolSize: [3, 14],
        itemStyle: { color: SHORT },
        data: sites.map((s, i) => (s.medianZ === undefined ? null : [round(s.medianZ), i]))
      }
    ]
  };
}

/** The height of a chart with one band per site (siteDistributionOption), as a CSS length. */
export function siteBandsHeight(sites: number): string {
  return `${Math.max(14, sites * 1.4 + 5)}rem`;
}

/** Share of reviewed processes meeting target, and meeting it with confidence, over the last quarters. */
export function shareTrendOption(figures: ReviewFigures): EChartsCoreOption {
  const t = figures.shareTrend;
  const pct = (v: number | undefined) => (v === undefined ? null : round(v * 100, 1));
  return {
    ...base,
    grid: { left: 8, right: 24, top: 28, bottom: 8, containLabel: true },
    legend: { top: 0, data: ['meeting target', 'meeting it, shown with confidence'] },
    tooltip: { trigger: 'axis', valueFormatter: (v: unknown) => (v === null ? '–' : `${String(v)} %`) },
    xAxis: { type: 'category', data: t.map((q) => q.quarter) },
    yAxis: { type: 'value', min: 0, max: 100, axisLabel: { formatter: '{value} %' } },
    series: [
      { type: 'line', name: 'meeting target', data: t.map((q) => pct(q.share)), itemStyle: { color: MEETS } },
      {
        type: 'line',
        name: 'meeting it, shown with confidence',
        data: t.map((q) => pct(q.shareShown)),
        itemStyle: { color: TARGET },
        lineStyle: { type: 'dashed' }
      }
    ]
  };
}

function round(v: number, digits = 2): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
