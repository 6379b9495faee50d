import Papa from 'papaparse';
import { parseLocaleNumber } from '../domain/locale-number';
import { detectDelimiter, detectFileDecimal } from './measurement-csv';

/** What the import dialog shows before anything is read in full: the detected format and the first rows. */
export interface CsvPreview {
  delimiter: ',' | ';' | '\t';
  decimal: '.' | ',';
  hasHeader: boolean;
  /** A label per column: the header cell, or "column N". */
  columns: string[];
  rows: string[][];
}

/**
 * Previews the start of a CSV/TSV file (a few dozen KB are enough). The first row is a header when some column
 * has a text cell there and numbers below it.
 */
export function previewCsv(
  text: string,
  options: { delimiter?: ',' | ';' | '\t'; decimal?: '.' | ','; localeMark?: '.' | ',' } = {}
): CsvPreview {
  const clean = text.replace(/^\uFEFF/, '');
  // The last line of a slice may be cut off: leave it out.
  const lines = clean.split(/\r?\n/);
  const complete = lines.length > 1 ? lines.slice(0, -1).join('\n') : clean;
  const delimiter = options.delimiter ?? detectDelimiter(complete);
  const rows = Papa.parse<string[]>(complete, { delimiter, skipEmptyLines: 'greedy' }).data.slice(0, 21);
  const decimal = options.decimal ?? detectFileDecimal(complete, rows.flat(), delimiter, options.localeMark);
  const first = rows[0] ?? [];
  const rest = rows.slice(1);
  const hasHeader =
    rest.length > 0 &&
    first.some(
      (cell, c) =>
        cell.trim() !== '' &&
        parseLocaleNumber(cell, decimal) === undefined &&
        rest.filter((r) => parseLocaleNumber(r[c] ?? '', decimal) !== undefined).length * 2 >= rest.length
    );
  const width = Math.max(0, ...rows.map((r) => r.length));
  const columns = Array.from({ length: width }, (_, c) =>
    hasHeader && first[c]?.trim() ? (first[c] as string).trim() : `column ${c + 1}`
  );
  return { delimiter, decimal, hasHeader, columns, rows: (hasHeader ? rest : rows).slice(0, 8) };
}

/**
 * A first mapping of the columns from the header words. The value column, where no header names it, is the
 * last column whose cells are all numbers among those not taken as date, subgroup or characteristic — the rule
 * pasted values follow (pasted-values.ts): a date column ("Datum") may hold digits, even spreadsheet day
 * numbers, and sits before the measurements.
 */
export function guessMapping(p: CsvPreview): {
  value: number;
  subgroup: number;
  period: number;
  characteristic: number;
} {
  const subgroup = guessColumn(p.columns, ['subgroup', 'group', 'gruppe', 'stichprobe', 'sample']) ?? -1;
  const period = guessColumn(p.columns, ['date', 'datum', 'time', 'period', 'month', 'monat', 'zeit']) ?? -1;
  const characteristic = guessColumn(p.columns, ['characteristic', 'merkmal', 'feature', 'parameter']) ?? -1;
  const free = p.columns
    .map((_, c) => c)
    .filter((c) => c !== subgroup && c !== period && c !== characteristic);
  const numeric = free.filter(
    (c) => p.rows.length > 0 && p.rows.every((r) => parseLocaleNumber(r[c] ?? '', p.decimal) !== undefined)
  );
  const named = guessColumn(p.columns, [
    'value',
    'wert',
    'valeur',
    'measure',
    'reading',
    'ergebnis',
    'result'
  ]);
  return {
    value: named ?? numeric.at(-1) ?? free[0] ?? 0,
    subgroup,
    period,
    characteristic
  };
}

/** The column whose label matches one of the words (case-insensitive), for a sensible first mapping. */
export function guessColumn(columns: readonly string[], words: readonly string[]): number | undefined {
  const i = columns.findIndex((c) => words.some((w) => c.toLowerCase().includes(w)));
  return i >= 0 ? i : undefined;
}
