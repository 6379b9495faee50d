import type { EChartsCoreOption } from 'echarts/core';
import type { QuarterCoverage } from '../../domain/quarter-coverage';

/** Colours of the three months of a quarter, light to dark: the last month reads as the most recent. */
const MONTH_COLOURS = ['#c9d6de', '#7e9cb0', '#1f3a4d'];

/**
 * Bar chart option: per site, the share of characteristics logged in each month of the quarter (in %).
 * A pure function of the data so that it is unit-tested without a browser.
 */
export function coverageChartOption(coverage: QuarterCoverage): EChartsCoreOption {
  const sites = coverage.sites.filter((s) => s.characteristics > 0);
  return {
    aria: { enabled: true },
    animation: false,
    grid: { left: 8, right: 16, top: 36, bottom: 8, containLabel: true },
    legend: { top: 0 },
    tooltip: { trigger: 'axis', valueFormatter: (v: unknown) => `${String(v)} %` },
    xAxis: { type: 'value', max: 100, axisLabel: { formatter: '{value} %' } },
    yAxis: { type: 'category', data: sites.map((s) => s.siteName), inverse: true },
    series: coverage.periods.map((period, m) => ({
      type: 'bar',
      name: period,
      itemStyle: { color: MONTH_COLOURS[m] },
      data: sites.map((s) => Math.round((1000 * (s.loggedByMonth[m] ?? 0)) / s.characteristics) / 10)
    }))
  };
}
