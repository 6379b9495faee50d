import { describe, expect, it } from 'vitest';
import demo from '../../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from '../../domain/context-profile';
import { parseDemoPortfolio } from '../../domain/demo-portfolio-schema';
import { buildQuarterReview } from '../../domain/quarter-review';
import { formatIndex } from '../../domain/figure-format';
import type { ReviewProcessLine } from '../../domain/review-figures';
import {
  movementOption,
  scatterPoints,
  paretoRows,
  siteBandsHeight,
  siteDistributionOption,
  zAgainstTargetOption
} from './review-chart-options';

const line = (
  id: string,
  cost: number | undefined,
  currency = 'EUR',
  z = 3,
  gap = -0.5
): ReviewProcessLine => ({
  processId: id,
  process: `P${id}`,
  site: 'S',
  status: gap < 0 ? 'short' : 'meets, shown',
  zLevel: z,
  zGap: gap,
  required: 1.33,
  requiredZ: z - gap + 0.25,
  costPerYear: cost,
  currency,
  priority: 0
});

describe('review chart options', () => {
  it('orders the cost Pareto largest first with the cumulative share (hand-checked)', () => {
    // 600 + 300 + 100 = 1000: cumulative 60 %, 90 %, 100 %; USD and zero costs are left out of the EUR chart.
    const rows = paretoRows(
      [line('a', 100), line('b', 600), line('c', 300), line('d', 50, 'USD'), line('e', 0)],
      'EUR'
    );
    expect(rows.map((r) => [r.process, r.cost, r.cumulative])).toEqual([
      ['Pb · S', 600, 0.6],
      ['Pc · S', 300, 0.9],
      ['Pa · S', 100, 1]
    ]);
  });

  it('puts the weakest process first and marks the required level the ranking carries, never one worked out again', () => {
    // The lines' requiredZ is set apart from z − gap on purpose: the chart must draw what the line carries.
    const option = zAgainstTargetOption([line('a', 1, 'EUR', 4, 0.5), line('b', 1, 'EUR', 2, -1.5)]) as {
      yAxis: { data: string[] };
      series: { data: unknown[] }[];
    };
    expect(option.yAxis.data).toEqual(['Pb · S', 'Pa · S']);
    // One bar per row, in the series whose legend colour it has: Pb is short, Pa meets.
    expect(option.series[0]!.data).toEqual([2, '-']);
    expect(option.series[1]!.data).toEqual(['-', 4]);
    expect(option.series[2]!.data).toEqual([3.75, 3.75]);
    const colours = (option as unknown as { series: { name: string; itemStyle: { color: string } }[] })
      .series;
    expect(colours[0]!.itemStyle.color).not.toBe(colours[1]!.itemStyle.color);
  });
});

describe('long portfolios', () => {
  it('draws at most the limit of bars, keeping the cumulative share of the whole total', () => {
    const lines = Array.from({ length: 50 }, (_, i) => line(String(i).padStart(2, '0'), 10));
    const rows = paretoRows(lines, 'EUR');
    expect(rows).toHaveLength(40);
    expect(rows.at(-1)!.cumulative).toBeCloseTo(0.8, 12);
  });

  it('draws a point per process as one path at company size, and as elements of their own in a small portfolio', () => {
    const figures = buildQuarterReview(parseDemoPortfolio(demo).records, BUILT_IN_PROFILES, {
      quarter: '2026-Q3'
    });
    type Series = { name: string; large?: boolean; largeThreshold?: number; data: unknown[] };
    const perProcess = [
      ...(siteDistributionOption(figures).series as Series[]).filter((x) => x.name === 'process'),
      ...(movementOption(figures).series as Series[])
    ];
    expect(perProcess).toHaveLength(3);
    for (const series of perProcess) {
      expect(series.large).toBe(true);
      // ECharts switches to one path only above the threshold: the demo's points stay elements, 2 000
      // processes do not.
      expect(series.largeThreshold).toBeGreaterThan(series.data.length);
      expect(series.largeThreshold).toBeLessThan(2000);
    }
  });

  it("hands a company's points over as pairs in one typed array, the same values as one array per point", () => {
    const pairs = Array.from({ length: 2000 }, (_, i): [number, number] => [i / 7, -i]);
    const small = scatterPoints(pairs.slice(0, 10), (p) => p);
    expect(small).toEqual(pairs.slice(0, 10));
    const large = scatterPoints(pairs, (p) => p);
    expect(large).toBeInstanceOf(Float64Array);
    expect(Array.from(large as Float64Array)).toEqual(pairs.flat());
  });

  it('names the process of a point in the movement chart by its series and place (the points carry no names)', () => {
    const figures = buildQuarterReview(parseDemoPortfolio(demo).records, BUILT_IN_PROFILES, {
      quarter: '2026-Q3'
    });
    const option = movementOption(figures) as {
      tooltip: { formatter: (p: { seriesIndex: number; dataIndex: number }) => string };
      series: { data: [number, number][] }[];
    };
    const beyond = figures.movers.filter((m) => m.beyondNoise);
    const within = figures.movers.filter((m) => !m.beyondNoise);
    expect(beyond.length + within.length).toBeGreaterThan(1);
    for (const [seriesIndex, list] of [beyond, within].entries())
      list.forEach((m, dataIndex) => {
        const text = option.tooltip.formatter({ seriesIndex, dataIndex });
        expect(text).toBe(
          `${m.process} · ${m.site}\n${figures.previousQuarter}: ${formatIndex(m.zBefore)}   ${figures.quarter}: ${formatIndex(m.zAfter)}`
        );
        expect(option.series[seriesIndex]!.data[dataIndex]![1]).toBeCloseTo(m.zAfter, 2);
      });
    expect(option.tooltip.formatter({ seriesIndex: 0, dataIndex: 10_000 })).toBe('');
  });
});

describe('the sites chart', () => {
  it('names every site down the side, one band each, with each process at its z-level', () => {
    const site = (i: number, zLevels: number[]) => ({
      siteId: `s${i}`,
      site: `Site ${i}`,
      processes: zLevels.length,
      reviewed: zLevels.length,
      meeting: 0,
      share: 0,
      cost: { byCurrency: [] },
      zLevels,
      medianZ: zLevels.length ? zLevels[0] : undefined
    });
    const sites = Array.from({ length: 50 }, (_, i) => site(i, i === 3 ? [2.5, 4] : [3]));
    const option = siteDistributionOption({ quarter: '2026-Q3', sites } as unknown as Parameters<
      typeof siteDistributionOption
    >[0]) as {
      yAxis: { type: string; data: string[]; axisLabel: { interval: number } };
      xAxis: { type: string };
      series: { name: string; data: ([number, number] | null)[] }[];
    };
    expect(option.yAxis.type).toBe('category');
    expect(option.yAxis.data).toHaveLength(50);
    // Interval 0: no name is left out to make room (ECharts hides crowded category names otherwise).
    expect(option.yAxis.axisLabel.interval).toBe(0);
    expect(option.xAxis.type).toBe('value');
    const points = option.series.find((x) => x.name === 'process')!.data;
    expect(points.filter((p) => p![1] === 3)).toEqual([
      [2.5, 3],
      [4, 3]
    ]);
    // Room for each band grows with the sites: 50 sites get more than a few.
    expect(parseFloat(siteBandsHeight(50))).toBeGreaterThan(parseFloat(siteBandsHeight(5)));
    expect(parseFloat(siteBandsHeight(50)) * 16).toBeGreaterThanOrEqual(50 * 20);
  });
});
