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

function isRealDay(year: number, month: number, day: number): boolean {
  if (month < 1 || month > 12 || day < 1) return false;
  return day <= new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/**
 * Milliseconds of an ISO 8601 date-time with an explicit offset (`2026-11-03T08:15:00.000Z`), or undefined for
 * anything else: another format, an impossible calendar day or time, or an instant outside 2000–2199.
 */
export function calendarTimeMs(text: string): number | undefined {
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

/** How far ahead, in words, for messages ("3 days", "2 hours"). */
export function durationWords(ms: number): string {
  const hours = ms / 3_600_000;
  if (hours < 48) return `${Math.round(hours)} hours`;
  const days = hours / 24;
  if (days < 730) return `${Math.round(days)} days`;
  return `${Math.round(days / 365.25)} years`;
}
