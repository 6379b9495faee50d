import Papa from 'papaparse';
import { inferDecimalMark } from '../domain/decimal-mark';
import {
  mapMasterListHeader,
  MASTER_LIST_COLUMNS,
  REQUIRED_MASTER_COLUMNS,
  type MasterListKey,
  type MasterListRow
} from '../domain/master-list';
import { detectDelimiter } from './measurement-csv';

/**
 * A master list as text — a CSV/TSV file or cells pasted from a spreadsheet — read into rows by its header: the
 * separator and the decimal mark are detected as for measurement files (or given), the columns matched by name.
 */
export interface MasterListText {
  delimiter: ',' | ';' | '\t';
  decimal: '.' | ',';
  header: string[];
  columns: Partial<Record<MasterListKey, number>>;
  /** Required columns the header lacks (the list cannot be read without them). */
  missing: MasterListKey[];
  rows: MasterListRow[];
}

const NUMERIC: MasterListKey[] = ['monthlyVolume', 'costPerDefective', 'lsl', 'target', 'usl'];

export function readMasterList(
  text: string,
  options: {
    delimiter?: ',' | ';' | '\t';
    decimal?: '.' | ',';
    /** Columns chosen by the user, replacing those matched from the header (-1: not in the list). */
    columns?: Partial<Record<MasterListKey, number>>;
  } = {}
): MasterListText {
  const clean = text.replace(/^\uFEFF/, '');
  const delimiter = options.delimiter ?? (clean.includes('\t') ? '\t' : detectDelimiter(clean));
  const data = Papa.parse<string[]>(clean, { delimiter, skipEmptyLines: false }).data;
  const header = (data[0] ?? []).map((h) => h.trim());
  const columns = mapMasterListHeader(header);
  for (const [key, at] of Object.entries(options.columns ?? {}) as [MasterListKey, number][]) {
    if (at < 0) delete columns[key];
    else columns[key] = at;
  }
  const missing = REQUIRED_MASTER_COLUMNS.filter((k) => columns[k] === undefined);
  const rows: MasterListRow[] = [];
  for (let i = 1; i < data.length; i++) {
    const cells = data[i]!;
    if (cells.every((c) => c.trim() === '')) continue;
    const row: MasterListRow = { line: i + 1 };
    for (const col of MASTER_LIST_COLUMNS) {
      const at = columns[col.key];
      if (at !== undefined && cells[at] !== undefined) row[col.key] = cells[at];
    }
    rows.push(row);
  }
  const decimal =
    options.decimal ??
    inferDecimalMark(
      rows.flatMap((r) => NUMERIC.flatMap((k) => (r[k] !== undefined ? [r[k]!] : []))),
      delimiter === ',' ? '.' : ','
    ).mark;
  return { delimiter, decimal, header, columns, missing, rows };
}
