import { countOf, PRINTED } from './figure-format';
/**
 * The instants and dates a record may carry. Every time stamp must be a real calendar value (no 30 February, no
 * hour 25) and lie in a plausible span; a stamp ahead of the reading device's own clock by more than
 * `CLOCK_TOLERANCE_MS` is refused where files are read, and no device's clock ever moves beyond its own time
 * plus that tolerance (hybrid-clock.ts). One day covers clocks set to the wrong time zone and ordinary drift;
 * beyond it the stamp is wrong, and accepting it would pin every later edit of the receiver to that instant.
 */
export const CLOCK_TOLERANCE_MS = 24 * 60 * 60 * 1000;

/** No record Capstan writes can be older than this; an earlier stamp is a damaged or invented one. */
export const EARLIEST_RECORD_MS = Date.UTC(2000, 0, 1);
/** Absolute upper limit, independent of any clock (13-digit milliseconds end in the year 2286). */
export const LATEST_RECORD_MS = Date.UTC(2200, 0, 1);

const DATE_TIME = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}:\d{2})$/;
const DATE_ONLY = /^(\d{4})-(\d{2})-(\d{2})$/;

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Gregorian calendar: a leap year is divisible by 4, except centuries not divisible by 400. */
function isRealDay(year: number, month: number, day: number): boolean {
  if (month < 1 || month > 12 || day < 1) return false;
  const leap = month === 2 && year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  return day <= DAYS_IN_MONTH[month - 1]! + (leap ? 1 : 0);
}

/** One decimal digit at `at`, or NaN. */
function digit(text: string, at: number): number {
  const a = text.charCodeAt(at) - 48;
  return a >= 0 && a <= 9 ? a : NaN;
}

/** Two decimal digits at `at`, or NaN. */
function twoDigits(text: string, at: number): number {
  const a = text.charCodeAt(at) - 48;
  const b = text.charCodeAt(at + 1) - 48;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : NaN;
}

/** Whether text has the shape of the form Capstan writes (`2026-11-03T08:15:00.000Z`), digits not looked at. */
function hasWrittenShape(text: string): boolean {
  return (
    text.length === 24 &&
    text.charCodeAt(4) === 45 &&
    text.charCodeAt(7) === 45 &&
    text.charCodeAt(10) === 84 &&
    text.charCodeAt(13) === 58 &&
    text.charCodeAt(16) === 58 &&
    text.charCodeAt(19) === 46 &&
    text.charCodeAt(23) === 90
  );
}

/**
 * The form every stamp Capstan writes has (`toISOString`: `2026-11-03T08:15:00.000Z`), read by character codes.
 * A file of a company's portfolio carries hundreds of thousands of stamps; a regular expression and `Date.parse`
 * each were a third of reading it. Returns null when the text has another form (the general reading decides).
 */
function canonicalTimeMs(text: string): number | undefined | null {
  if (!hasWrittenShape(text)) return null;
  const year = twoDigits(text, 0) * 100 + twoDigits(text, 2);
  const month = twoDigits(text, 5);
  const day = twoDigits(text, 8);
  const hour = twoDigits(text, 11);
  const minute = twoDigits(text, 14);
  const second = twoDigits(text, 17);
  const ms = twoDigits(text, 20) * 10 + digit(text, 22);
  // A sum is NaN when any part is (an array of the parts, per stamp, was garbage across a company's file).
  if (Number.isNaN(year + month + day + hour + minute + second + ms)) return null;
  if (!isRealDay(year, month, day) || hour > 23 || minute > 59 || second > 59) return undefined;
  const at = Date.UTC(year, month - 1, day, hour, minute, second, ms);
  return at < EARLIEST_RECORD_MS || at >= LATEST_RECORD_MS ? undefined : at;
}

/**
 * Milliseconds of an ISO 8601 date-time with an explicit offset (`2026-11-03T08:15:00.000Z`), or undefined for
 * anything else: another format, an impossible calendar day or time, or an instant outside 2000–2199.
 */
export function calendarTimeMs(text: string): number | undefined {
  const fast = canonicalTimeMs(text);
  if (fast !== null) return fast;
  return generalTimeMs(text);
}

/** Any ISO 8601 date-time with an offset, by pattern and `Date.parse`; exported for the test of the fast form. */
export function generalTimeMs(text: string): number | undefined {
  const m = DATE_TIME.exec(text);
  if (!m) return undefined;
  const [year, month, day, hour, minute, second] = [m[1], m[2], m[3], m[4], m[5], m[6] ?? '0'].map(
    Number
  ) as [number, number, number, number, number, number];
  if (!isRealDay(year, month, day) || hour > 23 || minute > 59 || second > 59) return undefined;
  const ms = Date.parse(text);
  if (!Number.isFinite(ms) || ms < EARLIEST_RECORD_MS || ms >= LATEST_RECORD_MS) return undefined;
  return ms;
}

/** A calendar date written YYYY-MM-DD that exists, in the years 1970–2199. */
export function isCalendarDate(text: string): boolean {
  const m = DATE_ONLY.exec(text);
  if (!m) return false;
  const year = Number(m[1]);
  return year >= 1970 && year < 2200 && isRealDay(year, Number(m[2]), Number(m[3]));
}

/** Whether an instant lies more than the tolerance ahead of `nowMs` (the reading device's clock). */
export function isAheadOfClock(ms: number, nowMs: number): boolean {
  return ms > nowMs + CLOCK_TOLERANCE_MS;
}

/**
 * For reading many date-times against one clock (a file's records): the milliseconds of `text` when it is a
 * date-time (calendarTimeMs) ahead of `nowMs` (isAheadOfClock), else undefined. Text in the form Capstan writes
 * sorts as its instants do (fixed-width digits, years 2000–2199), so such text at or before the clock's limit is
 * answered by comparing it with the limit's own text, without reading its date: a company's file holds a few
 * hundred thousand stamps, and every one had been read twice, once by the schema and once here.
 */
export function timeAheadOfClock(nowMs: number): (text: string) => number | undefined {
  const limitMs = nowMs + CLOCK_TOLERANCE_MS;
  // Written as toISOString writes it (milliseconds cut, not rounded: text at the limit's millisecond is not ahead).
  const limit = limitMs >= 0 && limitMs < LATEST_RECORD_MS ? new Date(limitMs).toISOString() : undefined;
  return (text) => {
    if (limit !== undefined && hasWrittenShape(text) && text <= limit) return undefined;
    const ms = calendarTimeMs(text);
    return ms !== undefined && isAheadOfClock(ms, nowMs) ? ms : undefined;
  };
}

/** How far ahead, in words, for messages ("3 days", "2 hours"). */
export function durationWords(ms: number): string {
  const hours = ms / 3_600_000;
  if (hours < 48) return countOf(Math.round(hours), 'hour', 'hours', PRINTED);
  const days = hours / 24;
  if (days < 730) return countOf(Math.round(days), 'day', 'days', PRINTED);
  return countOf(Math.round(days / 365.25), 'year', 'years', PRINTED);
}
