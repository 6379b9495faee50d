import Papa from 'papaparse';
import { parseLocaleNumber } from '../domain/locale-number';
import { detectDecimal, detectDelimiter } from './measurement-csv';

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
  options: { delimiter?: ',' | ';' | '\t'; decimal?: '.' | ',' } = {}
): CsvPreview {
  const clean = text.replace(/^\uFEFF/, '');
  // The last line of a slice may be cut off: leave it out.
  const lines = clean.split(/\r?\n/);
  const complete = lines.length > 1 ? lines.slice(0, -1).join('\n') : clean;
  const delimiter = options.delimiter ?? detectDelimiter(complete);
  const rows = Papa.parse<string[]>(complete, { delimiter, skipEmptyLines: 'greedy' }).data.slice(0, 21);
  const decimal = options.decimal ?? detectDecimal(rows.flat(), delimiter);
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
 * A first mapping of the columns from the header words, and for the value column else the first column whose
 * cells are all numbers — not merely digits: a date column such as "Datum" holds digits but no numbers.
 */
export function guessMapping(p: CsvPreview): {
  value: number;
  subgroup: number;
  period: number;
  characteristic: number;
} {
  const numeric = p.columns.findIndex(
    (_, c) => p.rows.length > 0 && p.rows.every((r) => parseLocaleNumber(r[c] ?? '', p.decimal) !== undefined)
  );
  return {
    value:
      guessColumn(p.columns, ['value', 'wert', 'valeur', 'measure', 'reading']) ??
      (numeric >= 0 ? numeric : 0),
    subgroup: guessColumn(p.columns, ['subgroup', 'group', 'gruppe', 'stichprobe', 'sample']) ?? -1,
    period: guessColumn(p.columns, ['date', 'datum', 'time', 'period', 'month', 'zeit']) ?? -1,
    characteristic: guessColumn(p.columns, ['characteristic', 'merkmal', 'feature', 'parameter']) ?? -1
  };
}

/** The column whose label matches one of the words (case-insensitive), for a sensible first mapping. */
export function guessColumn(columns: readonly string[], words: readonly string[]): number | undefined {
  const i = columns.findIndex((c) => words.some((w) => c.toLowerCase().includes(w)));
  return i >= 0 ? i : undefined;
}
