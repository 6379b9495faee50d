/**
 * A reporting period is a calendar month written `YYYY-MM` (ISO 8601 calendar month, reduced precision).
 * Months compare correctly as strings, which is why the format is strict: no `2026-1`, no `2026/01`.
 */
export type Period = string;

const PERIOD_PATTERN = /^(\d{4})-(0[1-9]|1[0-2])$/;

export function isPeriod(value: unknown): value is Period {
  return typeof value === 'string' && PERIOD_PATTERN.test(value);
}

/** Years a reporting month may lie in: records outside them are typing or file errors (0000-01, 9999-12). */
export const FIRST_PERIOD_YEAR = 1970;
export const LAST_PERIOD_YEAR = 2199;

/** Why a value is not a plausible reporting month, or undefined when it is one. */
export function periodProblem(value: unknown): string | undefined {
  const shown = typeof value === 'string' ? `'${value.slice(0, 20)}'` : String(value);
  if (!isPeriod(value)) return `Period ${shown} is not a month written YYYY-MM`;
  const year = Number(value.slice(0, 4));
  if (year < FIRST_PERIOD_YEAR || year > LAST_PERIOD_YEAR) {
    return `Period ${shown} lies outside the years ${FIRST_PERIOD_YEAR}–${LAST_PERIOD_YEAR}`;
  }
  return undefined;
}

export function periodOf(date: Date): Period {
  return `${date.getUTCFullYear()}-${String(date.getUTCMonth() + 1).padStart(2, '0')}`;
}

/** The period `months` after (or, when negative, before) `period`. */
export function addMonths(period: Period, months: number): Period {
  const match = PERIOD_PATTERN.exec(period);
  if (!match) throw new RangeError(`A month written YYYY-MM is needed (got '${period}')`);
  const index = Number(match[1]) * 12 + (Number(match[2]) - 1) + months;
  const year = Math.floor(index / 12);
  return `${String(year).padStart(4, '0')}-${String((index % 12) + 1).padStart(2, '0')}`;
}

/** Calendar quarter of a period, written `YYYY-Qn`. */
export function quarterOf(period: Period): string {
  const match = PERIOD_PATTERN.exec(period);
  if (!match) throw new RangeError(`A month written YYYY-MM is needed (got '${period}')`);
  return `${match[1]}-Q${Math.floor((Number(match[2]) - 1) / 3) + 1}`;
}

/** The three periods of a quarter written `YYYY-Qn`. */
export function periodsOfQuarter(quarter: string): Period[] {
  const match = /^(\d{4})-Q([1-4])$/.exec(quarter);
  if (!match) throw new RangeError(`A quarter written YYYY-Qn is needed (got '${quarter}')`);
  const first = `${match[1]}-${String((Number(match[2]) - 1) * 3 + 1).padStart(2, '0')}`;
  return [first, addMonths(first, 1), addMonths(first, 2)];
}

/** The calendar month it is now in a time zone (IANA name), as `YYYY-MM`. */
export function currentPeriodIn(timeZone: string, nowMs: number = Date.now()): Period {
  const parts = new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit'
  }).formatToParts(new Date(nowMs));
  const year = parts.find((p) => p.type === 'year')?.value ?? '1970';
  const month = parts.find((p) => p.type === 'month')?.value ?? '01';
  return `${year}-${month}`;
}

/** The last month that has ended (UTC): where a portfolio's window ends unless a person picks another. */
export function lastCompletePeriod(nowMs: number = Date.now()): Period {
  return addMonths(periodOf(new Date(nowMs)), -1);
}

/**
 * Why a month cannot be logged yet at a site, or undefined: a month is logged once it has begun in the site's
 * own time zone (the current month may be logged as it goes; later ones cannot).
 */
export function futurePeriodProblem(
  period: Period,
  site: { name: string; timeZone: string },
  nowMs: number = Date.now()
): string | undefined {
  const current = currentPeriodIn(site.timeZone, nowMs);
  if (period <= current) return undefined;
  return `${period} has not begun yet at ${site.name} (it is ${current} there, ${site.timeZone}); a month is logged once it has started`;
}
