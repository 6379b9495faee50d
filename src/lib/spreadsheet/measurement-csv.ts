import Papa from 'papaparse';
import { CsvInputError } from './csv-input-error';
import { inferDecimalMark } from '../domain/decimal-mark';
import { parseLocaleNumber, type DecimalMark } from '../domain/locale-number';

/**
 * Reading measured values from CSV/TSV text: delimiter and decimal mark detected (or given), a header row
 * recognised, a value column and an optional subgroup column picked by name or 1-based number. Parsing is
 * papaparse's (quotes, CRLF, BOM); this module only decides what the cells mean.
 */
export interface MeasurementCsvOptions {
  delimiter?: ',' | ';' | '\t' | 'auto';
  decimal?: DecimalMark;
  /** Header name or 1-based column number; default: the first column whose cells are numbers. */
  column?: string;
  subgroupColumn?: string;
}

export interface MeasurementCsv {
  values: number[];
  subgroups?: string[];
  delimiter: string;
  decimal: '.' | ',';
  hasHeader: boolean;
  columnName: string;
}

export { CsvInputError };

/**
 * Semicolon or tab when the first lines use it, comma otherwise (the common choice of European exports) —
 * except for a single column of numbers with a comma in each (`0,213` or `24,995` on every line), which is one
 * column of decimal-comma numbers, not two columns: it is read with a separator that does not occur. Whether a
 * `1,234` there is a decimal comma is then the decimal mark's question (detectDecimal), not the separator's.
 */
export function detectDelimiter(text: string): ',' | ';' | '\t' {
  const lines = text.split(/\r?\n/, 20).filter((l) => l.trim() !== '');
  const head = lines.slice(0, 5).join('\n');
  const count = (c: string) => head.split(c).length - 1;
  if (count('\t') > 0) return '\t';
  if (count(';') > 0) return ';';
  const headed = !/\d/.test(lines[0] ?? '');
  // A header with a comma names two or more columns: the comma separates them.
  if (headed && lines[0]!.includes(',')) return ',';
  return oneColumnOfCommaNumbers(text) ? ';' : ',';
}

/**
 * Whether the text is one column of numbers written with a comma (after an optional header without one): a
 * file of decimal-comma measurements. Its comma is the decimal mark, even where each could also be read as
 * grouping (`24,995`): a file with one number per line has no use for thousands separators.
 */
export function oneColumnOfCommaNumbers(text: string): boolean {
  const lines = text.split(/\r?\n/, 20).filter((l) => l.trim() !== '');
  const headed = !/\d/.test(lines[0] ?? '');
  if (headed && lines[0]!.includes(',')) return false;
  const body = lines.slice(headed ? 1 : 0);
  return body.length > 0 && body.every((l) => /^\s*[-+]?\d*,\d+\s*$/.test(l));
}

/**
 * The decimal mark of the cells, by the one rule for pasted values and files (domain/decimal-mark.ts); where the
 * cells do not settle it, `fallback` (the reader's own mark in the app; a point on the command line).
 */
export function detectDecimal(cells: string[], delimiter: string, fallback: '.' | ',' = '.'): '.' | ',' {
  if (delimiter === ',') return '.';
  return inferDecimalMark(cells, fallback).mark;
}

/** A file's decimal mark: a comma for one column of comma numbers, else from its cells (detectDecimal). */
export function detectFileDecimal(
  text: string,
  cells: string[],
  delimiter: string,
  fallback: '.' | ',' = '.'
): '.' | ',' {
  return oneColumnOfCommaNumbers(text) ? ',' : detectDecimal(cells, delimiter, fallback);
}

function columnIndex(
  spec: string | undefined,
  header: string[] | undefined,
  label: string
): number | undefined {
  if (spec === undefined) return undefined;
  if (header) {
    const byName = header.findIndex((h) => h.trim().toLowerCase() === spec.trim().toLowerCase());
    if (byName >= 0) return byName;
  }
  if (/^\d+$/.test(spec)) {
    const i = Number(spec) - 1;
    if (i >= 0) return i;
  }
  const known = header ? `; the columns are ${header.map((h) => `'${h}'`).join(', ')}` : '';
  throw new CsvInputError(`No ${label} column '${spec}'${known}`);
}

export function readMeasurementCsv(text: string, options: MeasurementCsvOptions = {}): MeasurementCsv {
  const clean = text.replace(/^\uFEFF/, '');
  if (clean.trim() === '') throw new CsvInputError('The file is empty');
  const delimiter =
    !options.delimiter || options.delimiter === 'auto' ? detectDelimiter(clean) : options.delimiter;
  const parsed = Papa.parse<string[]>(clean, { delimiter, skipEmptyLines: 'greedy' });
  const rows = parsed.data;
  if (rows.length === 0) throw new CsvInputError('The file has no rows');
  const sampleCells = rows.slice(0, 50).flat();
  const decimal =
    !options.decimal || options.decimal === 'auto'
      ? detectFileDecimal(clean, sampleCells, delimiter)
      : options.decimal;
  const first = rows[0] as string[];
  const hasHeader = first.some((c) => c.trim() !== '' && parseLocaleNumber(c, decimal) === undefined);
  const header = hasHeader ? first : undefined;
  const body = hasHeader ? rows.slice(1) : rows;
  const lineOffset = hasHeader ? 2 : 1;
  if (body.length === 0) throw new CsvInputError('The file has a header but no data rows');

  let valueCol = columnIndex(options.column, header, 'value');
  if (valueCol === undefined) {
    // The first column whose early cells are more than half numbers; a stray bad cell is then reported by its line.
    const head = body.slice(0, 20);
    const width = Math.max(...head.map((r) => r.length));
    for (let c = 0; c < width && valueCol === undefined; c += 1) {
      const numeric = head.filter((r) => parseLocaleNumber(r[c] ?? '', decimal) !== undefined).length;
      if (numeric * 2 > head.length) valueCol = c;
    }
    if (valueCol === undefined)
      throw new CsvInputError(
        'No column holds numbers in its first rows; name the value column with --column'
      );
  }
  const subgroupCol = columnIndex(options.subgroupColumn, header, 'subgroup');
  const columnName = header?.[valueCol] ?? `column ${valueCol + 1}`;
  const values: number[] = [];
  const subgroups: string[] = [];
  body.forEach((row, i) => {
    const line = i + lineOffset;
    const cell = row[valueCol as number];
    if (cell === undefined || cell.trim() === '') {
      throw new CsvInputError(
        `Line ${line}, column ${(valueCol as number) + 1} ('${columnName}'): the value is empty`
      );
    }
    const v = parseLocaleNumber(cell, decimal);
    if (v === undefined) {
      const shown = cell.length > 40 ? `${cell.slice(0, 40)}…` : cell;
      throw new CsvInputError(
        `Line ${line}, column ${(valueCol as number) + 1} ('${columnName}'): '${shown}' is not a number`
      );
    }
    values.push(v);
    if (subgroupCol !== undefined) {
      const g = (row[subgroupCol] ?? '').trim();
      if (g === '')
        throw new CsvInputError(`Line ${line}, column ${subgroupCol + 1}: the subgroup id is empty`);
      subgroups.push(g);
    }
  });
  return {
    values,
    ...(subgroupCol !== undefined ? { subgroups } : {}),
    delimiter,
    decimal,
    hasHeader,
    columnName
  };
}
