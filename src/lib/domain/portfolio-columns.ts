import { writeFigure, type FigureKind, type NumberStyle } from './figure-format';
import type { ProcessRow } from './portfolio-terms';

/**
 * The columns of the ranked portfolio: one definition for the Portfolio page's table, its CSV download and the
 * command line's `rank` (JSON keys and table). `label` is what the page and the printed table call it, `header`
 * the CSV's column name, `key` the JSON key; `value` gives the figure at full precision (the JSON's), `figure`
 * what kind of figure it is, so that the CSV and the printed table write it by the figure policy
 * (figure-format.ts).
 */
export interface PortfolioColumn {
  key: string;
  label: string;
  header: string;
  value: (row: ProcessRow, rank: number) => string | number | undefined | readonly string[];
  figure?: FigureKind | ((row: ProcessRow) => FigureKind);
}

/** The ruling figure is in the unit of the context's measure: an index or z-level, or a ppm. */
const rulingFigure = (r: ProcessRow): FigureKind => (r.profile?.measure === 'ppm' ? 'ppm' : 'index');

const zBasisShort = (r: ProcessRow) => (r.zBasis === 'short-term' ? 'ST' : 'LT');

export const PORTFOLIO_COLUMNS = [
  { key: 'rank', label: '#', header: 'rank', value: (_r, rank) => rank, figure: 'count' },
  { key: 'process', label: 'Process', header: 'process', value: (r) => r.process.name },
  { key: 'site', label: 'Site', header: 'site', value: (r) => r.site.name },
  {
    key: 'context',
    label: 'Context',
    header: 'context',
    value: (r) => r.profile?.label ?? r.process.contextId
  },
  { key: 'status', label: 'Status', header: 'status', value: (r) => r.status },
  {
    key: 'zLevel',
    label: 'z-level',
    header: 'z-level (as reported)',
    value: (r) => r.zLevel,
    figure: 'index'
  },
  { key: 'zBasis', label: 'LT/ST', header: 'z-level basis', value: (r) => r.zBasis },
  {
    key: 'requiredZ',
    label: 'required z',
    header: 'required z-level',
    value: (r) => r.requiredZ,
    figure: 'index'
  },
  { key: 'zGap', label: 'z gap', header: 'z gap', value: (r) => r.zGap, figure: 'index' },
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
    value: (r) => r.weakest?.estimate,
    figure: rulingFigure
  },
  {
    key: 'rulingBound',
    label: 'one-sided bound',
    header: 'one-sided bound',
    value: (r) => r.weakest?.bound,
    figure: rulingFigure
  },
  {
    key: 'required',
    label: 'required',
    header: 'required',
    value: (r) => r.weakest?.required,
    figure: rulingFigure
  },
  { key: 'measure', label: 'measure', header: 'measure', value: (r) => r.profile?.measure },
  { key: 'yield', label: 'Yield', header: 'yield', value: (r) => r.yield, figure: 'yield' },
  { key: 'ppm', label: 'ppm', header: 'ppm', value: (r) => r.ppm, figure: 'ppm' },
  {
    key: 'costPerYear',
    label: 'Cost per year',
    header: 'cost per year',
    value: (r) => r.costPerYear,
    figure: 'money'
  },
  { key: 'currency', label: 'currency', header: 'currency', value: (r) => r.process.currency },
  {
    key: 'trendSlope',
    label: 'Trend',
    header: 'trend slope (z per month)',
    value: (r) => r.trendSlope,
    figure: 'slope'
  },
  { key: 'badges', label: 'Assumptions', header: 'assumptions', value: (r) => r.badges },
  {
    key: 'projects',
    label: 'Projects',
    header: 'projects',
    value: (r) => r.projects.map((p) => `${p.phase}: ${p.title}`)
  },
  { key: 'priority', label: 'priority', header: 'priority', value: (r) => r.priority, figure: 'score' }
] as const satisfies readonly PortfolioColumn[];

export type PortfolioColumnKey = (typeof PORTFOLIO_COLUMNS)[number]['key'];

export function portfolioColumn(key: PortfolioColumnKey): PortfolioColumn {
  return PORTFOLIO_COLUMNS.find((c) => c.key === key)!;
}

/** A column's cell written for people or a spreadsheet: figures by the policy, lists joined by "; ". */
export function writtenCell(
  column: PortfolioColumn,
  row: ProcessRow,
  rank: number,
  style: NumberStyle
): string {
  const v = column.value(row, rank);
  if (typeof v === 'number') {
    const kind = typeof column.figure === 'function' ? column.figure(row) : column.figure;
    return kind ? writeFigure(kind, v, style) : String(v);
  }
  if (v === undefined) return '';
  return typeof v === 'string' ? v : v.join('; ');
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
