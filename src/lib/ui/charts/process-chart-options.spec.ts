import { describe, expect, it } from 'vitest';
import { individualsStability } from '../../stats/stability';
import { controlChartOption, histogramBins, histogramOption, zHistoryOption } from './process-chart-options';

describe('process chart options', () => {
  it('bins every value once, over the data and the limits', () => {
    const values = Array.from({ length: 100 }, (_, i) => 10 + (i % 10) / 10);
    const bins = histogramBins(values, [9, 12]);
    expect(bins.counts).toHaveLength(10);
    expect(bins.counts.reduce((a, b) => a + b, 0)).toBe(100);
    expect(bins.start).toBe(9);
  });

  it('draws limits, the required level and flagged points', () => {
    const h = histogramOption([1, 2, 3, 2, 2], { lsl: 0, usl: 4 }, () => 0.2) as {
      series: { markLine?: { data: { name: string }[] } }[];
    };
    expect(h.series[0]?.markLine?.data.map((d) => d.name)).toEqual(['LSL', 'USL']);
    expect(h.series).toHaveLength(2);
    const z = zHistoryOption(
      [
        { period: '2026-01', z: 3.1 },
        { period: '2026-02', z: undefined }
      ],
      4
    ) as { series: { data: (number | null)[]; markLine: { data: { yAxis: number }[] } }[] };
    expect(z.series[0]?.data).toEqual([3.1, null]);
    expect(z.series[0]?.markLine.data[0]?.yAxis).toBe(4);
    const series = Array.from({ length: 30 }, (_, i) => (i === 4 ? 5 : 1 + (i % 2 ? 0.05 : -0.05)));
    const c = controlChartOption(series, individualsStability(series)) as {
      series: { data: { itemStyle: { color: string } }[] }[];
    };
    expect(c.series[0]?.data[4]?.itemStyle.color).toBe('#8a3b12');
  });
});
