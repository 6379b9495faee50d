import { describe, expect, it } from 'vitest';
import { normalQuantile } from '../../stats/normal-distribution';
import { modelProbabilityPlot } from '../../stats/probability-plot';
import { controlChartSeries, individualsStability, subgroupStability } from '../../stats/stability';
import {
  axisBounds,
  controlChartOption,
  histogramBins,
  histogramOption,
  probabilityPlotOption,
  zHistoryOption
} from './process-chart-options';

interface Axis {
  min: number;
  max: number;
  name?: string;
  nameLocation?: string;
}
interface MarkLine {
  data: { name: string; yAxis?: number }[];
}
interface Series {
  name: string;
  data: unknown[];
  markLine?: MarkLine;
  xAxisIndex?: number;
}

const inView = (axis: Axis, v: number) => v > axis.min && v < axis.max;

describe('process chart options', () => {
  it('bins every value once, over the data and the limits', () => {
    const values = Array.from({ length: 100 }, (_, i) => 10 + (i % 10) / 10);
    const bins = histogramBins(values, [9, 12]);
    expect(bins.counts).toHaveLength(10);
    expect(bins.counts.reduce((a, b) => a + b, 0)).toBe(100);
    expect(bins.start).toBe(9);
  });

  it('draws the histogram with its limits and hides edge labels that would overlap the round ticks', () => {
    const h = histogramOption([1, 2, 3, 2, 2], { lsl: 0, usl: 4 }, () => 0.2) as {
      series: Series[];
      xAxis: { axisLabel: { hideOverlap: boolean; showMinLabel: boolean } };
    };
    expect(h.series[0]?.markLine?.data.map((d) => d.name)).toEqual(['LSL', 'USL']);
    expect(h.series).toHaveLength(2);
    expect(h.xAxis.axisLabel).toMatchObject({ hideOverlap: true, showMinLabel: false });
  });

  it('keeps the required level inside the z-by-month axis, however far it is from the data', () => {
    const z = zHistoryOption(
      [
        { period: '2026-01', z: 3.1 },
        { period: '2026-02', z: undefined },
        { period: '2026-03', z: 4.2 }
      ],
      5.01
    ) as { series: Series[]; yAxis: Axis };
    expect(z.series[0]?.data).toEqual([3.1, null, 4.2]);
    expect(z.series[0]?.markLine?.data[0]?.yAxis).toBe(5.01);
    expect(inView(z.yAxis, 5.01)).toBe(true);
    expect(inView(z.yAxis, 3.1)).toBe(true);
    // The axis name sits beside the axis's middle: never cut to "202…" at the edge.
    expect(z.yAxis.nameLocation).toBe('middle');
  });

  it('rounds axis bounds outward to round numbers, a margin beyond every point and line', () => {
    expect(axisBounds([3.1, 4.2], [5.01])).toEqual({ min: 2.5, max: 5.5 });
    const b = axisBounds([10.02, 10.03], [9.5, 10.5]);
    expect(b.min).toBeLessThan(9.5);
    expect(b.max).toBeGreaterThan(10.5);
    expect(axisBounds([7, 7], [])).toEqual({ min: 6.6, max: 7.4 });
  });

  it('draws both panels of an individuals chart, limits in view, each signal at its point with its rule', () => {
    // Tight values with one far point: the limits sit close to the data, and the far point breaks rule 1 on
    // the values and on the two moving ranges around it.
    const values = Array.from({ length: 30 }, (_, i) => (i === 4 ? 5 : 1 + (i % 2 ? 0.05 : -0.05)));
    const stability = individualsStability(values);
    const series = controlChartSeries(values, undefined, stability.chart);
    const c = controlChartOption(series, stability) as {
      series: Series[];
      yAxis: Axis[];
      grid: unknown[];
    };
    expect(c.grid).toHaveLength(2);
    const named = (name: string) => c.series.find((s) => s.name === name)!;
    expect(c.series.map((s) => s.name)).toEqual([
      'value',
      'UCL',
      'centre',
      'LCL',
      'moving range',
      'UCL (spread)',
      'centre (spread)'
    ]);
    // Each limit is a line at its value across every point, on its own panel.
    expect(named('UCL').data).toEqual(values.map(() => stability.ucl));
    expect(named('UCL (spread)')).toMatchObject({
      xAxisIndex: 1,
      data: values.map(() => stability.spreadUcl)
    });
    const [location, spread] = c.yAxis as [Axis, Axis];
    for (const v of [stability.lcl, stability.ucl, stability.centre, 5])
      expect(inView(location, v)).toBe(true);
    for (const v of [stability.spreadUcl, stability.spreadCentre]) expect(inView(spread, v)).toBe(true);
    const point = (s: Series, i: number) =>
      s.data[i] as { itemStyle: { color: string }; label?: { formatter: string } };
    expect(named('value')).toMatchObject({ showAllSymbol: true });
    expect(point(named('value'), 4).label?.formatter).toBe('beyond 3σ');
    expect(point(named('value'), 3).label).toBeUndefined();
    // Moving ranges are drawn at the later of their two values: the first point has none.
    expect((named('moving range').data[0] as { value: unknown }).value).toBeNull();
    expect(point(named('moving range'), 4).label?.formatter).toBe('beyond 3σ');
    expect(point(named('moving range'), 5).label?.formatter).toBe('beyond 3σ');
  });

  it('draws an X̄ and R chart from the subgroups the limits were computed on', () => {
    const groups = Array.from({ length: 8 }, (_, g) => [10 + g * 0.01, 10.2, 9.9, 10.1, 10 - g * 0.02]);
    const stability = subgroupStability(groups, 0.12);
    const series = controlChartSeries([], groups, stability.chart);
    expect(stability.chart).toBe('xbar-r');
    expect(series.location).toHaveLength(8);
    // A range is the subgroup's largest minus its smallest value.
    expect(series.spread[7]).toBeCloseTo(10.2 - 9.86, 12);
    const c = controlChartOption(series, stability) as { series: Series[]; yAxis: Axis[] };
    expect(c.series.filter((s) => !/UCL|LCL|centre/.test(s.name)).map((s) => s.name)).toEqual([
      'subgroup mean',
      'range'
    ]);
    expect(inView(c.yAxis[0]!, stability.ucl)).toBe(true);
    expect(inView(c.yAxis[1]!, stability.spreadUcl)).toBe(true);
  });

  it('plots a probability plot against the named model, with its reference line and band in view', () => {
    const sorted = Float64Array.from({ length: 50 }, (_, i) => 10 + normalQuantile((i + 0.5) / 50));
    const plot = modelProbabilityPlot(sorted, { quantile: (p) => 10 + normalQuantile(p) });
    const o = probabilityPlotOption(plot, 'lognormal') as { series: Series[]; xAxis: Axis; yAxis: Axis };
    expect(o.xAxis.name).toBe('expected under the lognormal model');
    expect(o.series.map((s) => s.name)).toEqual(['values', 'reference y = x', '95 % band', '95 % band']);
    for (const v of [...plot.lower, ...plot.upper, ...plot.value]) {
      expect(v).toBeGreaterThanOrEqual(o.yAxis.min);
      expect(v).toBeLessThanOrEqual(o.yAxis.max);
    }
  });
});
