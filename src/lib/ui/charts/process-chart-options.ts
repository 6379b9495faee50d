import type { EChartsCoreOption } from 'echarts/core';
import type { StabilityResult } from '../../stats/stability';

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
    grid: { left: 8, right: 24, top: 24, bottom: 8, containLabel: true },
    tooltip: { trigger: 'axis' },
    xAxis: { type: 'category', data: points.map((p) => p.period) },
    yAxis: { type: 'value', name: 'z-level', scale: true },
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
                          label: { formatter: 'required' },
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
    grid: { left: 8, right: 24, top: 24, bottom: 8, containLabel: true },
    tooltip: { trigger: 'axis' },
    xAxis: { type: 'value', scale: true, min: bins.start, max: bins.start + bins.width * bins.counts.length },
    yAxis: { type: 'value', name: 'count' },
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

/** Values against normal scores: a straight line means normal. */
export function probabilityPlotOption(plot: { value: number[]; normalScore: number[] }): EChartsCoreOption {
  return {
    animation: false,
    aria: { enabled: true },
    grid: { left: 8, right: 24, top: 24, bottom: 8, containLabel: true },
    tooltip: { trigger: 'item' },
    xAxis: { type: 'value', name: 'normal score', scale: true },
    yAxis: { type: 'value', name: 'value', scale: true },
    series: [
      {
        type: 'scatter',
        name: 'values',
        symbolSize: 5,
        itemStyle: { color: INK },
        data: plot.normalScore.map((z, i) => [Number(z.toFixed(3)), plot.value[i]])
      }
    ]
  };
}

/** Individuals (or subgroup means) in time order with the centre line and control limits. */
export function controlChartOption(points: readonly number[], stability: StabilityResult): EChartsCoreOption {
  const flagged = new Set(stability.signals.filter((s) => s.chart === 'location').map((s) => s.index));
  return {
    animation: false,
    aria: { enabled: true },
    grid: { left: 8, right: 48, top: 24, bottom: 8, containLabel: true },
    tooltip: { trigger: 'axis' },
    xAxis: { type: 'category', data: points.map((_, i) => i + 1) },
    yAxis: { type: 'value', scale: true },
    series: [
      {
        type: 'line',
        name: stability.chart === 'individuals' ? 'value' : 'subgroup mean',
        data: points.map((v, i) => ({ value: v, itemStyle: { color: flagged.has(i) ? LIMIT : INK } })),
        lineStyle: { color: INK },
        markLine: {
          symbol: 'none',
          data: [
            { name: 'UCL', yAxis: stability.ucl, label: { formatter: 'UCL' }, lineStyle: { color: LIMIT } },
            {
              name: 'centre',
              yAxis: stability.centre,
              label: { formatter: 'centre' },
              lineStyle: { color: '#44606f', type: 'dashed' }
            },
            { name: 'LCL', yAxis: stability.lcl, label: { formatter: 'LCL' }, lineStyle: { color: LIMIT } }
          ]
        }
      }
    ]
  };
}
