import { decimalsFor, P_VALUE_FLOOR } from '../stats/plain-number';
import { fixedDecimalText } from './fixed-decimal-text';

export { decimalsFor };

/**
 * How Capstan writes a figure for people — one policy for the pages, the portfolio's CSV download and the
 * command line's tables, so that the three never disagree. JSON output keeps full precision and does not pass
 * through here.
 *
 * The policy:
 *  - indices (Cp, Cpk, Pp, Ppk, Cpm) and z-levels: 2 decimals;
 *  - ppm: whole numbers, grouped, from 100 up; 2 significant digits below 100; "< 0.01" below 0.01;
 *  - yield: a percentage with the decimals its loss (100 % − yield) needs to show 2 significant digits, from 1
 *    to 5; a yield that would round to 100 % is written "> 99.99999 %", one that would round to 0 % "< 0.1 %";
 *  - measured values: to the resolution of their data (the decimals of the values as entered); their mean and
 *    standard deviation one decimal more (common practice when reporting statistics of rounded data);
 *  - proportions and other small figures: significant digits, never scientific notation.
 *
 * Every function writes '–' for a missing figure. The style says in which locale and whether thousands are
 * grouped: on screen the reader's locale, in the CSV a plain form a spreadsheet reads as a number.
 */
export interface NumberStyle {
  /** A BCP 47 tag; undefined for the reader's own locale. */
  locale: string | undefined;
  /** Thousands separators (never in the CSV: a spreadsheet would read "2,865" as text or as two cells). */
  grouping: boolean;
}

/** On the pages: the reader's locale (decimal comma where it uses one), thousands grouped. */
export const SCREEN: NumberStyle = { locale: undefined, grouping: true };
/** The CSV download: decimal point, no grouping. */
export const PLAIN: NumberStyle = { locale: 'en-US', grouping: false };
/** The command line's tables for people: decimal point, thousands grouped. */
export const PRINTED: NumberStyle = { locale: 'en-US', grouping: true };

export const MISSING = '–';
export const INDEX_DECIMALS = 2;
const YIELD_MAX_DECIMALS = 5;
/** Decimals beyond which a measured value is not written (resolution finer than this is noise in the data). */
const MAX_RESOLUTION = 9;

const formats = new Map<string, Intl.NumberFormat>();

/** What stands for a missing figure ('–') or an unbounded one ('∞', '−∞'). */
function notFinite(v: number | undefined): string {
  return v === undefined || Number.isNaN(v) ? MISSING : v > 0 ? '∞' : '−∞';
}

/**
 * Fixed decimals in a style. One formatter per style and number of decimals, made once: building one per call
 * cost seconds on a review of 2 000 processes.
 */
export function formatFixed(v: number, decimals: number, style: NumberStyle = SCREEN): string {
  // The CSV's and the command line's style: the same text as Intl's, without a call into it per figure.
  if (style.locale === 'en-US' && Number.isFinite(v)) return fixedDecimalText(v, decimals, style.grouping);
  const key = `${style.locale ?? ''}|${style.grouping ? 1 : 0}|${decimals}`;
  let format = formats.get(key);
  if (!format) {
    format = new Intl.NumberFormat(style.locale, {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
      useGrouping: style.grouping
    });
    formats.set(key, format);
  }
  return format.format(v);
}

/** v to `digits` significant digits, in positional notation however small or large. */
export function formatSignificant(
  v: number | undefined,
  digits: number,
  style: NumberStyle = SCREEN
): string {
  if (v === undefined || !Number.isFinite(v)) return notFinite(v);
  // Rounding to the digits can carry into a new one (0.0996 → 0.10): decimals are taken from the rounded value.
  const rounded = Number(v.toPrecision(digits));
  return formatFixed(rounded, decimalsFor(rounded, digits), style);
}

/** An index or a z-level: 2 decimals. */
export function formatIndex(v: number | undefined, style: NumberStyle = SCREEN): string {
  if (v === undefined || !Number.isFinite(v)) return notFinite(v);
  return formatFixed(v, INDEX_DECIMALS, style);
}

/** Parts per million: grouped whole numbers from 100, 2 significant digits below, "< 0.01" below 0.01. */
export function formatPpm(ppm: number | undefined, style: NumberStyle = SCREEN): string {
  if (ppm === undefined || !Number.isFinite(ppm)) return MISSING;
  if (ppm === 0) return '0';
  if (ppm < 0.01) return `< ${formatFixed(0.01, 2, style)}`;
  if (ppm < 100) return formatSignificant(ppm, 2, style);
  return formatFixed(Math.round(ppm), 0, style);
}

/** The decimals of a yield in percent: enough for 2 significant digits of its loss, from 1 to 5. */
export function yieldDecimals(y: number): number {
  const lossPercent = (1 - y) * 100;
  return Math.min(YIELD_MAX_DECIMALS, Math.max(1, decimalsFor(lossPercent, 2)));
}

/** A yield (a fraction from 0 to 1) as a percentage, without the false precision of "100.00000 %". */
export function formatYield(y: number | undefined, style: NumberStyle = SCREEN): string {
  if (y === undefined || !Number.isFinite(y)) return MISSING;
  if (y >= 1) return `${formatFixed(100, 0, style)} %`;
  if (y <= 0) return `${formatFixed(0, 0, style)} %`;
  const decimals = yieldDecimals(y);
  const step = 10 ** -decimals;
  const percent = y * 100;
  if (percent > 100 - step / 2) return `> ${formatFixed(100 - step, decimals, style)} %`;
  if (percent < 0.05) return `< ${formatFixed(0.1, 1, style)} %`;
  return `${formatFixed(percent, decimals, style)} %`;
}

/**
 * The yield as a fraction with the same resolution as formatYield's percentage, for the CSV (a number a
 * spreadsheet can compute with). Near 1 it is rounded down, never up to a perfect 1 it is not.
 */
export function plainYieldFraction(y: number | undefined): string {
  if (y === undefined || !Number.isFinite(y)) return '';
  if (y >= 1 || y <= 0) return String(Math.min(1, Math.max(0, y)));
  const decimals = yieldDecimals(y) + 2;
  const scale = 10 ** decimals;
  const rounded = Math.round(y * scale) / scale;
  return formatFixed(rounded >= 1 ? (scale - 1) / scale : rounded, decimals, PLAIN);
}

/** A share (a fraction) as a whole percentage: "83 %". */
export function formatShare(share: number | undefined, style: NumberStyle = SCREEN): string {
  return share === undefined || !Number.isFinite(share) ? MISSING : `${formatFixed(share * 100, 0, style)} %`;
}

/** Whole numbers, grouped on screen. */
export function formatCount(v: number | undefined, style: NumberStyle = SCREEN): string {
  return v === undefined || !Number.isFinite(v) ? MISSING : formatFixed(v, 0, style);
}

/**
 * The resolution of a set of values: the most decimals any of them was written with (shortest round-trip form,
 * so 10.2 has 1 and 10.25 has 2), capped at 9.
 */
export function resolutionOf(values: Iterable<number>): number {
  let most = 0;
  for (const v of values) {
    if (!Number.isFinite(v) || Number.isInteger(v)) continue;
    const text = String(Math.abs(v));
    const e = text.indexOf('e-');
    // 1e-7 and smaller print in exponent form: the decimals are the exponent plus the mantissa's.
    const decimals =
      e >= 0
        ? Number(text.slice(e + 2)) + Math.max(0, text.slice(0, e).split('.')[1]?.length ?? 0)
        : (text.split('.')[1]?.length ?? 0);
    if (decimals > most) most = decimals;
  }
  return Math.min(MAX_RESOLUTION, most);
}

/** A measured value at its data's resolution. */
export function formatMeasured(
  v: number | undefined,
  resolution: number,
  style: NumberStyle = SCREEN
): string {
  if (v === undefined || !Number.isFinite(v)) return notFinite(v);
  return formatFixed(v, resolution, style);
}

/** A number as it was entered: its own decimals (a limit, a reported mean), never scientific notation. */
export function formatAsEntered(v: number, style: NumberStyle = SCREEN): string {
  return formatMeasured(v, resolutionOf([v]), style);
}

/** A mean or standard deviation of data at this resolution: one decimal more than the data. */
export function formatStatistic(
  v: number | undefined,
  resolution: number,
  style: NumberStyle = SCREEN
): string {
  return formatMeasured(v, Math.min(MAX_RESOLUTION, resolution + 1), style);
}

/** "1 study", "3 studies": a count with its noun in the right number. */
export function countOf(n: number, one: string, many: string, style: NumberStyle = SCREEN): string {
  return `${formatCount(n, style)} ${n === 1 ? one : many}`;
}

/** A p-value: 3 decimals, "< 0.001" below (a smaller p says nothing more to a reader deciding on it). */
export function formatPValue(p: number | undefined, style: NumberStyle = SCREEN): string {
  if (p === undefined || Number.isNaN(p)) return MISSING;
  return p < P_VALUE_FLOOR ? `< ${formatFixed(P_VALUE_FLOOR, 3, style)}` : formatFixed(p, 3, style);
}

/** What a figure is, for writing it by the policy wherever it goes (portfolio-columns.ts names its columns'). */
export type FigureKind = 'count' | 'index' | 'ppm' | 'yield' | 'money' | 'slope' | 'score';

/**
 * A figure written by the policy in a style. In the CSV (PLAIN) every figure stays a number a spreadsheet can
 * compute with: a ppm below 0.01 keeps its 2 significant digits instead of "< 0.01", and a yield is a fraction at
 * the resolution of its percentage (plainYieldFraction).
 */
export function writeFigure(kind: FigureKind, v: number | undefined, style: NumberStyle): string {
  if (v === undefined || Number.isNaN(v)) return style === PLAIN ? '' : MISSING;
  switch (kind) {
    case 'count':
    case 'money':
      return formatCount(Math.round(v), style);
    case 'index':
    case 'score':
      return formatIndex(v, style);
    case 'ppm':
      return style === PLAIN && v > 0 && v < 0.01 ? formatSignificant(v, 2, style) : formatPpm(v, style);
    case 'yield':
      return style === PLAIN ? plainYieldFraction(v) : formatYield(v, style);
    case 'slope':
      // z per month: changes of a few hundredths matter, so two significant digits rather than two decimals.
      return formatSignificant(v, 2, style);
  }
}
