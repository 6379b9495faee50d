import type { ProcessRow } from './portfolio-terms';

/**
 * The columns of the ranked portfolio: one definition for the Portfolio page's table, its CSV download and the
 * command line's `rank` (JSON keys and table). `label` is what the page and the printed table call it, `header`
 * the CSV's column name, `key` the JSON key; `value` gives the figure at full precision (formatting is the
 * reader's business).
 */
export interface PortfolioColumn {
  key: string;
  label: string;
  header: string;
  value: (row: ProcessRow, rank: number) => string | number | undefined | readonly string[];
}

const zBasisShort = (r: ProcessRow) => (r.zBasis === 'short-term' ? 'ST' : 'LT');

export const PORTFOLIO_COLUMNS = [
  { key: 'rank', label: '#', header: 'rank', value: (_r, rank) => rank },
  { key: 'process', label: 'Process', header: 'process', value: (r) => r.process.name },
  { key: 'site', label: 'Site', header: 'site', value: (r) => r.site.name },
  {
    key: 'context',
    label: 'Context',
    header: 'context',
    value: (r) => r.profile?.label ?? r.process.contextId
  },
  { key: 'status', label: 'Status', header: 'status', value: (r) => r.status },
  { key: 'zLevel', label: 'z-level', header: 'z-level (as reported)', value: (r) => r.zLevel },
  { key: 'zBasis', label: 'LT/ST', header: 'z-level basis', value: (r) => r.zBasis },
  { key: 'requiredZ', label: 'required z', header: 'required z-level', value: (r) => r.requiredZ },
  { key: 'zGap', label: 'z gap', header: 'z gap', value: (r) => r.zGap },
  {
    key: 'weakest',
    label: 'Weakest characteristic',
    header: 'weakest characteristic',
    value: (r) => r.weakest?.characteristic.name
  },
  {
    key: 'rulingEstimate',
    label: 'ruling estimate',
    header: 'ruling estimate',
    value: (r) => r.weakest?.estimate
  },
  { key: 'rulingBound', label: 'one-sided bound', header: 'one-sided bound', value: (r) => r.weakest?.bound },
  { key: 'required', label: 'required', header: 'required', value: (r) => r.weakest?.required },
  { key: 'measure', label: 'measure', header: 'measure', value: (r) => r.profile?.measure },
  { key: 'yield', label: 'Yield', header: 'yield', value: (r) => r.yield },
  { key: 'ppm', label: 'ppm', header: 'ppm', value: (r) => r.ppm },
  { key: 'costPerYear', label: 'Cost per year', header: 'cost per year', value: (r) => r.costPerYear },
  { key: 'currency', label: 'currency', header: 'currency', value: (r) => r.process.currency },
  { key: 'trendSlope', label: 'Trend', header: 'trend slope (z per month)', value: (r) => r.trendSlope },
  { key: 'badges', label: 'Assumptions', header: 'assumptions', value: (r) => r.badges },
  {
    key: 'projects',
    label: 'Projects',
    header: 'projects',
    value: (r) => r.projects.map((p) => `${p.phase}: ${p.title}`)
  },
  { key: 'priority', label: 'priority', header: 'priority', value: (r) => r.priority }
] as const satisfies readonly PortfolioColumn[];

export type PortfolioColumnKey = (typeof PORTFOLIO_COLUMNS)[number]['key'];

export function portfolioColumn(key: PortfolioColumnKey): PortfolioColumn {
  return PORTFOLIO_COLUMNS.find((c) => c.key === key)!;
}

/** One row as an object keyed by the columns' keys (the command line's JSON). */
export function portfolioRowObject(row: ProcessRow, rank: number): Record<PortfolioColumnKey, unknown> {
  return Object.fromEntries(PORTFOLIO_COLUMNS.map((c) => [c.key, c.value(row, rank)])) as Record<
    PortfolioColumnKey,
    unknown
  >;
}

/** "4.41 ST": a z-level with its basis, for printed tables. */
export function zWithBasis(row: ProcessRow, format: (z: number) => string): string {
  return row.zLevel === undefined ? '–' : `${format(row.zLevel)} ${zBasisShort(row)}`;
}
