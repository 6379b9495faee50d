/**
 * Reads a number as people type it in many locales: decimal point or decimal comma, optional thousands
 * separators (space, narrow no-break space, apostrophe, or the other of . and ,), a leading sign, and an
 * exponent. Returns undefined for text that is not a number (empty cells included), never NaN.
 *
 * With `decimal: 'auto'` a lone separator decides: `1,5` and `1.5` are 1.5; with both, the last one is the
 * decimal mark (`1.234,5` and `1,234.5` are 1234.5). A single group of exactly three digits after one comma
 * (`1,234`) is ambiguous and read as the decimal comma only when `decimal` is ','.
 */
export type DecimalMark = '.' | ',' | 'auto';

const GROUPING = /[\s\u00a0\u202f']/g;

export function parseLocaleNumber(text: string, decimal: DecimalMark = 'auto'): number | undefined {
  let s = text
    .trim()
    .replace(/^\+/, '')
    .replace(/\u2212/g, '-');
  if (s === '') return undefined;
  s = s.replace(GROUPING, '');
  const lastDot = s.lastIndexOf('.');
  const lastComma = s.lastIndexOf(',');
  let mark: '.' | ',';
  if (decimal !== 'auto') mark = decimal;
  else if (lastDot >= 0 && lastComma >= 0) mark = lastDot > lastComma ? '.' : ',';
  // A leading 0 group (`0,015`) is never grouping; `1,234` stays ambiguous and is read as grouping.
  else if (lastComma >= 0) mark = /^-?[1-9]\d{0,2}(,\d{3})+$/.test(s) ? '.' : ',';
  else mark = '.';
  const group = mark === '.' ? ',' : '.';
  if (s.includes(group)) {
    // Grouping separators must sit between groups of three digits before the decimal mark, after a lead
    // group that does not start with 0 (`0,213` is never 213).
    const intPart = s.split(mark)[0] ?? '';
    if (!new RegExp(`^-?[1-9]\\d{0,2}(\\${group}\\d{3})+$`).test(intPart)) return undefined;
    s = s.split(group).join('');
  }
  if (mark === ',') s = s.replace(',', '.');
  if (!/^-?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(s)) return undefined;
  const v = Number(s);
  return Number.isFinite(v) ? v : undefined;
}

/** The decimal mark of a BCP 47 locale (de-DE → ',', en-US → '.'), from Intl's own formatting. */
export function decimalMarkOf(locale: string | undefined): '.' | ',' {
  try {
    const part = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === 'decimal');
    return part?.value === ',' ? ',' : '.';
  } catch {
    return '.';
  }
}
