import { PORTFOLIO_COLUMNS } from '../domain/portfolio-columns';
import type { ProcessRow } from '../domain/portfolio-terms';
import type { Study } from '../domain/study';
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

/** One study's data as reported: values (with subgroups) for raw data, one row otherwise. */
export function studyCsv(study: Study, characteristicName: string): string {
  const d = study.data;
  const head = ['characteristic', 'month'];
  switch (d.kind) {
    case 'raw':
      return toCsv([
        [...head, 'subgroup', 'value'],
        ...d.values.map((v, i) => [characteristicName, study.period, d.subgroups?.[i], v])
      ]);
    case 'summary':
      return toCsv([
        [...head, 'n', 'mean', 'sd'],
        [characteristicName, study.period, d.n, d.mean, d.sd]
      ]);
    case 'defectives':
      return toCsv([
        [...head, 'units', 'defectives'],
        [characteristicName, study.period, d.units, d.defectives]
      ]);
    case 'defects':
      return toCsv([
        [...head, 'units', 'defects', 'opportunities per unit'],
        [characteristicName, study.period, d.units, d.defects, d.opportunitiesPerUnit]
      ]);
  }
}
