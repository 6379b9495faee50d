import { PORTFOLIO_COLUMNS } from '../domain/portfolio-columns';
import type { ProcessRow } from '../domain/portfolio-terms';
import { toCsv, type CsvCell } from './spreadsheet-csv';

/** The ranked portfolio as the Portfolio page shows it, one row per process, for a spreadsheet. */
export function portfolioCsv(
  rows: readonly ProcessRow[],
  window: { endPeriod: string; windowMonths: number }
): string {
  const header = [...PORTFOLIO_COLUMNS.map((c) => c.header), 'window ends', 'window months'];
  const cell = (v: ReturnType<(typeof PORTFOLIO_COLUMNS)[number]['value']>): CsvCell =>
    Array.isArray(v) ? v.join('; ') : (v as CsvCell);
  const body: CsvCell[][] = rows.map((r, i) => [
    ...PORTFOLIO_COLUMNS.map((c) => cell(c.value(r, i + 1))),
    window.endPeriod,
    window.windowMonths
  ]);
  return toCsv([header, ...body]);
}
