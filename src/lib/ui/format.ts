/** Display formatting shared by the pages; one place so every page writes numbers the same way. */

import { formatAsEntered, formatCount } from '../domain/figure-format';

export { countOf, formatCount } from '../domain/figure-format';

const moneyFormats = new Map<string, Intl.NumberFormat | undefined>();

/** Whole amounts in a currency; one formatter per currency, made once (a new one per call is slow at scale). */
export function formatMoney(value: number, currency: string): string {
  if (!moneyFormats.has(currency)) {
    let format: Intl.NumberFormat | undefined;
    try {
      format = new Intl.NumberFormat(undefined, { style: 'currency', currency, maximumFractionDigits: 0 });
    } catch {
      format = undefined; // not an ISO 4217 code the browser knows: the amount and the code as written
    }
    moneyFormats.set(currency, format);
  }
  const format = moneyFormats.get(currency);
  return format ? format.format(value) : `${formatCount(value)} ${currency}`;
}

export function formatBytes(bytes: number | undefined): string {
  if (bytes === undefined) return 'unknown';
  const units = ['B', 'KB', 'MB', 'GB', 'TB'];
  let v = bytes;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) {
    v /= 1024;
    u += 1;
  }
  return `${v.toFixed(u === 0 ? 0 : 1)} ${units[u]}`;
}

/** A limit or target as entered (its own decimals, never scientific notation), or an en dash where there is none. */
export function formatLimit(value: number | undefined): string {
  return value === undefined ? '–' : formatAsEntered(value);
}

let dateTimeFormat: Intl.DateTimeFormat | undefined;

/**
 * A moment in the reader's locale, date and time. One formatter, made at first use: `toLocaleString` with options
 * builds a new one per call, a sixth of the process page's first drawing (a time per study listed) at 2 000
 * processes with the CPU throttled 4×.
 */
export function formatDateTime(iso: string): string {
  dateTimeFormat ??= new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
  const date = new Date(iso);
  // As toLocaleString writes a date it cannot read ('Invalid Date'), where format would throw.
  return Number.isNaN(date.getTime()) ? String(date) : dateTimeFormat.format(date);
}
