/**
 * CSV for spreadsheets: RFC 4180 quoting (fields with the delimiter, quotes or line breaks are quoted, quotes
 * doubled) and formula neutralising — a text cell that starts with =, +, -, @ (or a tab or carriage return) gets a
 * leading apostrophe, so a spreadsheet shows it instead of running it (the OWASP "CSV injection" advice). Numbers
 * are written as numbers, so a negative value stays a number; so is a number already written by the figure
 * policy (WrittenNumber), which keeps its decimals ("1.20", not 1.2).
 */
export type CsvCell = string | number | WrittenNumber | undefined | null;

/** A number written as text by the figure policy (plain style: digits, a minus sign, a decimal point). */
export class WrittenNumber {
  constructor(readonly text: string) {}
}

const PLAIN_NUMBER = /^-?\d+(\.\d+)?$/;
const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(value: CsvCell, delimiter = ','): string {
  if (value === undefined || value === null) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  // Anything else a figure could be written as ("∞", "", a marker) is text, and neutralised like text.
  if (value instanceof WrittenNumber)
    return PLAIN_NUMBER.test(value.text) ? value.text : csvCell(value.text, delimiter);
  const text = FORMULA_START.test(value) ? `'${value}` : value;
  return text.includes(delimiter) || /["\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(rows: readonly (readonly CsvCell[])[], delimiter = ','): string {
  return `${rows.map((r) => r.map((c) => csvCell(c, delimiter)).join(delimiter)).join('\r\n')}\r\n`;
}
