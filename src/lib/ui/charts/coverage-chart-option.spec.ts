import { describe, expect, it } from 'vitest';
import type { QuarterCoverage } from '../../domain/quarter-coverage';
import { coverageChartOption } from './coverage-chart-option';

const coverage: QuarterCoverage = {
  quarter: '2026-Q3',
  periods: ['2026-07', '2026-08', '2026-09'],
  sites: [
    {
      siteId: 'a',
      siteName: 'Alpha',
      processes: 2,
      characteristics: 4,
      loggedByMonth: [4, 3, 0],
      expected: 12
    },
    {
      siteId: 'b',
      siteName: 'Empty',
      processes: 0,
      characteristics: 0,
      loggedByMonth: [0, 0, 0],
      expected: 0
    },
    {
      siteId: 'c',
      siteName: 'Gamma',
      processes: 1,
      characteristics: 3,
      loggedByMonth: [1, 2, 3],
      expected: 9
    }
  ],
  projectsByPhase: [],
  quartersWithData: ['2026-Q3']
};

describe('coverage chart option', () => {
  it('gives one series per month with the logged share per site, leaving out sites without characteristics', () => {
    const option = coverageChartOption(coverage) as {
      yAxis: { data: string[] };
      series: { name: string; data: number[] }[];
    };
    expect(option.yAxis.data).toEqual(['Alpha', 'Gamma']);
    expect(option.series.map((s) => s.name)).toEqual(coverage.periods);
    // 3 of 4 = 75 %, 2 of 3 = 66.7 % (rounded to one decimal)
    expect(option.series[1]?.data).toEqual([75, 66.7]);
    expect(option.series[2]?.data).toEqual([0, 100]);
  });
});
