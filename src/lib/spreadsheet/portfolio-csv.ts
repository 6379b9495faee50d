import { PLAIN } from '../domain/figure-format';
import { PORTFOLIO_COLUMNS, writtenCell } from '../domain/portfolio-columns';
import type { ProcessRow } from '../domain/portfolio-terms';
import { toCsv, WrittenNumber, type CsvCell } from './spreadsheet-csv';

/**
 * The ranked portfolio as the Portfolio page shows it, one row per process, for a spreadsheet: figures written
 * by the figure policy in its plain style (no 17-digit floats; numbers a spreadsheet reads as numbers).
 */
export function portfolioCsv(
  rows: readonly ProcessRow[],
  window: { endPeriod: string; windowMonths: number }
): string {
  const header = [...PORTFOLIO_COLUMNS.map((c) => c.header), 'window ends', 'window months'];
  const body: CsvCell[][] = rows.map((r, i) => [
    ...PORTFOLIO_COLUMNS.map((c): CsvCell => {
      const text = writtenCell(c, r, i + 1, PLAIN);
      return 'figure' in c ? new WrittenNumber(text) : text;
    }),
    window.endPeriod,
    window.windowMonths
  ]);
  return toCsv([header, ...body]);
}
