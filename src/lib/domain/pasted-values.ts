import { inferDecimalMark, type DecimalMarkReading } from './decimal-mark';
import { parseLocaleNumber, type DecimalMark } from './locale-number';

/**
 * Reads a block of measurements as people type or paste it: one value per line, values separated by spaces or
 * semicolons, or cells copied from a spreadsheet (tab-separated columns). With several columns the value column
 * is the last one that holds numbers and the first other column gives the subgroup ids. A first row whose value
 * cell is not a number is taken as a header.
 *
 * The decimal mark is read from the whole block by the same rule as CSV files (decimal-mark.ts), unless the
 * person stated it: `0,213` on every line is a decimal comma whatever the browser's language. When the block
 * leaves it open (`1,234`), `decimal.ambiguous` is set and the caller must ask before using the values.
 */
export interface PastedValues {
  values: number[];
  subgroups?: string[];
  header?: string[];
  /** Cells that could not be read, by line of the block (1-based). */
  problems: { line: number; message: string }[];
  /** The decimal mark used, and whether the block left it open. */
  decimal: DecimalMarkReading;
}

function cellsOf(line: string): string[] {
  if (line.includes('\t')) return line.split('\t').map((c) => c.trim());
  if (line.includes(';'))
    return line
      .split(';')
      .map((c) => c.trim())
      .filter((c) => c !== '');
  return line.trim().split(/\s+/);
}

export function parsePastedValues(
  text: string,
  stated: DecimalMark = 'auto',
  localeMark: '.' | ',' = '.'
): PastedValues {
  const lines = text
    .split(/\r?\n/)
    .map((l, i) => ({ line: i + 1, text: l }))
    .filter((l) => l.text.trim() !== '');
  const reading: DecimalMarkReading =
    stated === 'auto'
      ? inferDecimalMark(
          lines.flatMap((l) => cellsOf(l.text)),
          localeMark
        )
      : { mark: stated, ambiguous: false };
  const decimal = reading.mark;
  if (lines.length === 0) return { values: [], problems: [], decimal: reading };
  const tabular = lines.some((l) => l.text.includes('\t'));
  const problems: PastedValues['problems'] = [];
  if (!tabular) {
    // Free typing: every cell is a value; a first line of words is a header.
    const rows = lines.map((l) => ({ line: l.line, cells: cellsOf(l.text) }));
    let header: string[] | undefined;
    if (rows[0] && rows[0].cells.every((c) => parseLocaleNumber(c, decimal) === undefined)) {
      header = rows[0].cells;
      rows.shift();
    }
    const values: number[] = [];
    for (const r of rows) {
      for (const c of r.cells) {
        const v = parseLocaleNumber(c, decimal);
        if (v === undefined) problems.push({ line: r.line, message: `'${c}' is not a number` });
        else values.push(v);
      }
    }
    return { values, ...(header ? { header } : {}), problems, decimal: reading };
  }
  const rows = lines.map((l) => ({ line: l.line, cells: cellsOf(l.text) }));
  const width = Math.max(...rows.map((r) => r.cells.length));
  const body = rows.slice(1);
  const numericShare = (c: number) =>
    body.length === 0
      ? 0
      : body.filter((r) => parseLocaleNumber(r.cells[c] ?? '', decimal) !== undefined).length / body.length;
  let valueCol = width - 1;
  while (valueCol > 0 && numericShare(valueCol) <= 0.5) valueCol -= 1;
  const first = rows[0] as { line: number; cells: string[] };
  const hasHeader = parseLocaleNumber(first.cells[valueCol] ?? '', decimal) === undefined;
  const data = hasHeader ? body : rows;
  const subgroupCol = width > 1 ? (valueCol === 0 ? 1 : 0) : undefined;
  const values: number[] = [];
  const subgroups: string[] = [];
  for (const r of data) {
    const cell = r.cells[valueCol] ?? '';
    const v = parseLocaleNumber(cell, decimal);
    if (v === undefined) {
      problems.push({
        line: r.line,
        message: cell === '' ? 'the value cell is empty' : `'${cell}' is not a number`
      });
      continue;
    }
    values.push(v);
    if (subgroupCol !== undefined) subgroups.push(r.cells[subgroupCol] ?? '');
  }
  const useSubgroups = subgroupCol !== undefined && subgroups.every((g) => g !== '');
  return {
    values,
    ...(useSubgroups ? { subgroups } : {}),
    ...(hasHeader ? { header: first.cells } : {}),
    problems,
    decimal: reading
  };
}
