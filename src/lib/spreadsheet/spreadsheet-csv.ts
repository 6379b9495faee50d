/**
 * CSV for spreadsheets: RFC 4180 quoting (fields with the delimiter, quotes or line breaks are quoted, quotes
 * doubled) and formula neutralising — a text cell that starts with =, +, -, @ (or a tab or carriage return) gets a
 * leading apostrophe, so a spreadsheet shows it instead of running it (the OWASP "CSV injection" advice). Numbers
 * are written as numbers, so a negative value stays a number.
 */
export type CsvCell = string | number | undefined | null;

const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(value: CsvCell, delimiter = ','): string {
  if (value === undefined || value === null) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = FORMULA_START.test(value) ? `'${value}` : value;
  return text.includes(delimiter) || /["\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(rows: readonly (readonly CsvCell[])[], delimiter = ','): string {
  return `${rows.map((r) => r.map((c) => csvCell(c, delimiter)).join(delimiter)).join('\r\n')}\r\n`;
}
