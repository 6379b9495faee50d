import type { EChartsCoreOption } from 'echarts/core';
import type { ModelProbabilityPlot } from '../../stats/probability-plot';
import type { RuleSignal, StabilityResult } from '../../stats/stability';

/** Pure builders of the process page's charts (data → ECharts option), unit-tested without a browser. */

const INK = '#1f3a4d';
const ACCENT = '#b86e14';
const LIMIT = '#8a3b12';

const limitLine = (name: string, value: number, axis: 'x' | 'y') => ({
  name,
  [`${axis}Axis`]: value,
  label: { formatter: name },
  lineStyle: { color: LIMIT, type: 'solid' }
});

/** Axis names sit beside the axis's middle, where they are never cut off at the chart's edge. */
const axisName = (name: string, gap: number) => ({ name, nameLocation: 'middle', nameGap: gap });

/** A round step near a fifth of the range: 1, 2 or 5 × a power of ten. */
function niceStep(range: number): number {
  const raw = range / 5;
  const power = 10 ** Math.floor(Math.log10(raw));
  const m = raw / power;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * power;
}

/**
 * Bounds of a value axis that hold every data point and every line drawn across it (limits, a required level),
 * with a margin, on round numbers: an axis that stops inside a limit hides the limit.
 */
export function axisBounds(values: readonly (number | null | undefined)[], lines: readonly number[]) {
  const all = [...values, ...lines].filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
  if (all.length === 0) return { min: 0, max: 1 };
  let lo = Math.min(...all);
  let hi = Math.max(...all);
  if (hi === lo) {
    const half = Math.abs(lo) * 0.05 || 0.5;
    lo -= half;
    hi += half;
  }
  const pad = (hi - lo) * 0.06;
  const step = niceStep(hi - lo + 2 * pad);
  const round = (v: number) => Number(v.toPrecision(12));
  return {
    min: round(Math.floor((lo - pad) / step) * step),
    max: round(Math.ceil((hi + pad) / step) * step)
  };
}

/**
 * z-level month by month, with the required level as a dashed line and a dotted upright line at each month the
 * specification limits changed (months before it were judged against other limits).
 */
export function zHistoryOption(
  points: { period: string; z: number | undefined }[],
  required: number | undefined,
  limitChanges: readonly string[] = []
): EChartsCoreOption {
  const shown = new Set(points.map((p) => p.period));
  const changeLines = limitChanges
    .filter((from) => shown.has(from))
    .map((from) => ({
      name: 'limits changed',
      xAxis: from,
      label: { formatter: 'limits changed' },
      lineStyle: { color: LIMIT, type: 'dotted' }
    }));
  return {
    animation: false,
    aria: { enabled: true },
    grid: { left: 48, right: 64, top: 16, bottom: 28 },
    tooltip: { trigger: 'axis' },
    xAxis: { type: 'category', data: points.map((p) => p.period), axisLabel: { hideOverlap: true } },
    // The axis holds the required level as well as the data: "required 5.01" is drawn, not cut off at 5.
    yAxis: {
      type: 'value',
      ...axisName('z-level', 34),
      ...axisBounds(
        points.map((p) => p.z),
        required !== undefined ? [required] : []
      )
    },
    series: [
      {
        type: 'line',
        name: 'z-level',
        data: points.map((p) => (p.z === undefined || !Number.isFinite(p.z) ? null : Number(p.z.toFixed(3)))),
        itemStyle: { color: INK },
        connectNulls: false,
        ...(required !== undefined || changeLines.length > 0
          ? {
              markLine: {
                symbol: 'none',
                data: [
                  ...(required !== undefined
                    ? [
                        {
                          name: 'required',
                          yAxis: Number(required.toFixed(3)),
                          label: { formatter: 'required', position: 'end' },
                          lineStyle: { color: ACCENT, type: 'dashed' }
                        }
                      ]
                    : []),
                  ...changeLines
                ]
              }
            }
          : {})
      }
    ]
  };
}

/** Histogram bins: √n of them (at least 5, at most 40), equal width over the data and the limits. */
export function histogramBins(
  values: readonly number[],
  limits: readonly number[]
): { start: number; width: number; counts: number[] } {
  const all = [...values, ...limits];
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  const k = Math.max(5, Math.min(40, Math.round(Math.sqrt(values.length))));
  const width = hi > lo ? (hi - lo) / k : 1;
  const counts = new Array<number>(k).fill(0);
  for (const v of values) counts[Math.min(k - 1, Math.floor((v - lo) / width))]! += 1;
  return { start: lo, width, counts };
}

/** Histogram with the specification limits and the fitted model's density scaled to counts. */
export function histogramOption(
  values: readonly number[],
  spec: { lsl?: number; usl?: number },
  density?: (x: number) => number
): EChartsCoreOption {
  const limits = [spec.lsl, spec.usl].filter((v): v is number => v !== undefined);
  const bins = histogramBins(values, limits);
  const centres = bins.counts.map((_, i) => bins.start + (i + 0.5) * bins.width);
  return {
    animation: false,
    aria: { enabled: true },
    grid: { left: 48, right: 24, top: 24, bottom: 28 },
    tooltip: { trigger: 'axis' },
    // The axis starts and ends at the bins' edges; labels that would overlap a round tick beside them are hidden
    // (the edge value and a tick 0.06 away read as "27 27.94").
    xAxis: {
      type: 'value',
      min: bins.start,
      max: bins.start + bins.width * bins.counts.length,
      axisLabel: { hideOverlap: true, showMinLabel: false, showMaxLabel: false }
    },
    yAxis: { type: 'value', ...axisName('count', 34), minInterval: 1 },
    series: [
      {
        type: 'bar',
        name: 'values',
        barWidth: '96%',
        data: centres.map((c, i) => [Number(c.toPrecision(6)), bins.counts[i]]),
        itemStyle: { color: '#7e9cb0' },
        markLine: {
          symbol: 'none',
          data: [
            ...(spec.lsl !== undefined ? [limitLine('LSL', spec.lsl, 'x')] : []),
            ...(spec.usl !== undefined ? [limitLine('USL', spec.usl, 'x')] : [])
          ]
        }
      },
      ...(density
        ? [
            {
              type: 'line',
              name: 'fitted model',
              showSymbol: false,
              itemStyle: { color: INK },
              data: Array.from({ length: 81 }, (_, i) => {
                const x = bins.start + (i / 80) * bins.width * bins.counts.length;
                return [Number(x.toPrecision(6)), density(x) * values.length * bins.width];
              })
            }
          ]
        : [])
    ]
  };
}

/**
 * The ordered values against where the chosen model expects them (modelProbabilityPlot): on the reference line
 * y = x if the model holds, inside the dashed band at its level. `model` names the model on the axis.
 */
export function probabilityPlotOption(plot: ModelProbabilityPlot, model: string): EChartsCoreOption {
  const band = (name: string, ys: number[]) => ({
    type: 'line',
    name,
    showSymbol: false,
    lineStyle: { color: '#7e9cb0', type: 'dashed', width: 1 },
    itemStyle: { color: '#7e9cb0' },
    data: plot.expected.map((x, i) => [x, ys[i]])
  });
  // One scale on both axes, holding the values, where the model expects them and the band.
  const bounds = axisBounds([...plot.value, ...plot.expected, ...plot.lower, ...plot.upper], []);
  return {
    animation: false,
    aria: { enabled: true },
    grid: { left: 56, right: 24, top: 24, bottom: 40 },
    tooltip: { trigger: 'item' },
    legend: { top: 0, data: ['values', 'reference y = x', `${Math.round(plot.level * 100)} % band`] },
    xAxis: { type: 'value', ...axisName(`expected under the ${model} model`, 26), ...bounds },
    yAxis: { type: 'value', ...axisName('value', 42), ...bounds },
    series: [
      {
        type: 'scatter',
        name: 'values',
        symbolSize: 5,
        itemStyle: { color: INK },
        data: plot.expected.map((x, i) => [x, plot.value[i]])
      },
      {
        type: 'line',
        name: 'reference y = x',
        showSymbol: false,
        lineStyle: { color: ACCENT },
        itemStyle: { color: ACCENT },
        data: [
          [bounds.min, bounds.min],
          [bounds.max, bounds.max]
        ]
      },
      band(`${Math.round(plot.level * 100)} % band`, plot.lower),
      band(`${Math.round(plot.level * 100)} % band`, plot.upper)
    ]
  };
}

const spreadBounds = (b: { min: number; max: number }) => ({ min: Math.max(0, b.min), max: b.max });

/** What each run rule found, as the point's label says it. */
export const RULE_LABELS: Record<RuleSignal['rule'], string> = {
  1: 'beyond 3σ',
  2: '9 on one side',
  3: '6 steadily moving'
};

/**
 * Both panels of the control chart, one above the other on the same points: the location (individuals or
 * subgroup means) and the spread (moving ranges, ranges or standard deviations), each with its centre line and
 * limits always in view, and each signal marked at its point with the rule it broke.
 */
export function controlChartOption(
  series: { location: readonly number[]; spread: readonly number[] },
  stability: StabilityResult
): EChartsCoreOption {
  const individuals = stability.chart === 'individuals';
  const names = {
    location: individuals ? 'value' : 'subgroup mean',
    spread: individuals ? 'moving range' : stability.chart === 'xbar-r' ? 'range' : 'standard deviation'
  };
  // A moving range belongs between two values: it is drawn at the later of the two.
  const spreadOffset = individuals ? 1 : 0;
  const categories = series.location.map((_, i) => i + 1);
  const signalsOf = (panel: RuleSignal['chart']) => {
    const byPoint = new Map<number, string[]>();
    for (const s of stability.signals)
      if (s.chart === panel) {
        const at = s.index + (panel === 'spread' ? spreadOffset : 0);
        byPoint.set(at, [...(byPoint.get(at) ?? []), RULE_LABELS[s.rule]]);
      }
    return byPoint;
  };
  const located = signalsOf('location');
  const spreadFlags = signalsOf('spread');
  // Limits and centre lines are series of their own across every point, each named at its right-hand end:
  // drawn as plain lines they are certain to sit at their value on their own panel's axis.
  const level = (
    name: string,
    value: number,
    panel: 0 | 1,
    style: { color: string; type: 'solid' | 'dashed' },
    offset: number
  ) => ({
    type: 'line',
    name: `${name}${panel ? ' (spread)' : ''}`,
    xAxisIndex: panel,
    yAxisIndex: panel,
    data: categories.map(() => value),
    showSymbol: false,
    silent: true,
    lineStyle: { ...style, width: 1 },
    itemStyle: { color: style.color },
    tooltip: { show: false },
    endLabel: { show: true, formatter: name, color: style.color, fontSize: 10, offset: [4, offset] }
  });
  const limitStyle = { color: LIMIT, type: 'solid' as const };
  const centreStyle = { color: '#44606f', type: 'dashed' as const };
  const points = (values: readonly (number | null)[], flags: Map<number, string[]>) =>
    values.map((v, i) => ({
      value: v,
      itemStyle: { color: flags.has(i) ? LIMIT : INK },
      symbolSize: flags.has(i) ? 8 : 4,
      ...(flags.has(i)
        ? {
            label: {
              show: true,
              position: 'top',
              formatter: flags.get(i)!.join(', '),
              color: LIMIT,
              fontSize: 10
            }
          }
        : {})
    }));
  const spreadValues: (number | null)[] = [
    ...Array.from({ length: spreadOffset }, () => null),
    ...series.spread
  ];
  const spreadLcl = stability.spreadLcl > 0 ? stability.spreadLcl : undefined;
  return {
    animation: false,
    aria: { enabled: true },
    tooltip: { trigger: 'axis' },
    axisPointer: { link: [{ xAxisIndex: 'all' }] },
    grid: [
      { left: 56, right: 60, top: 20, height: '52%' },
      { left: 56, right: 60, top: '72%', bottom: 28 }
    ],
    xAxis: [
      { type: 'category', gridIndex: 0, data: categories, axisLabel: { show: false } },
      { type: 'category', gridIndex: 1, data: categories, axisLabel: { hideOverlap: true } }
    ],
    yAxis: [
      {
        type: 'value',
        gridIndex: 0,
        ...axisName(names.location, 44),
        ...axisBounds(series.location, [stability.lcl, stability.ucl, stability.centre])
      },
      {
        type: 'value',
        gridIndex: 1,
        splitNumber: 3,
        ...axisName(names.spread, 44),
        // A spread is never below zero: the axis starts there.
        ...spreadBounds(axisBounds(series.spread, [stability.spreadUcl, stability.spreadCentre, 0]))
      }
    ],
    series: [
      {
        type: 'line',
        name: names.location,
        xAxisIndex: 0,
        yAxisIndex: 0,
        data: points(series.location, located),
        // Every point drawn (ECharts thins symbols to the axis labels by default): a signal is marked at its point.
        showAllSymbol: true,
        lineStyle: { color: INK }
      },
      level('UCL', stability.ucl, 0, limitStyle, -6),
      level('centre', stability.centre, 0, centreStyle, 0),
      level('LCL', stability.lcl, 0, limitStyle, 6),
      {
        type: 'line',
        name: names.spread,
        xAxisIndex: 1,
        yAxisIndex: 1,
        connectNulls: false,
        data: points(spreadValues, spreadFlags),
        showAllSymbol: true,
        lineStyle: { color: INK }
      },
      level('UCL', stability.spreadUcl, 1, limitStyle, -6),
      level('centre', stability.spreadCentre, 1, centreStyle, 0),
      ...(spreadLcl !== undefined ? [level('LCL', spreadLcl, 1, limitStyle, 6)] : [])
    ]
  };
}
