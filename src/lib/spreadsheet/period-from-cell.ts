/**
 * The reporting month of a date or timestamp cell: `2026-03`, `2026-03-14`, `2026/03/14`, `14.03.2026`,
 * `14/03/2026` (day first, as most sites outside North America write it), or an ISO 8601 timestamp, whose month
 * is taken in the site's time zone (a reading at 23:30 UTC on the 31st may belong to the next month locally).
 * Returns undefined for anything else.
 */
export function periodFromCell(text: string, timeZone = 'UTC'): string | undefined {
  const s = text.trim();
  if (/^\d{4}-(0[1-9]|1[0-2])$/.test(s)) return s;
  let m = /^(\d{4})[-/](\d{1,2})[-/](\d{1,2})$/.exec(s);
  if (m) return monthOf(Number(m[1]), Number(m[2]), Number(m[3]));
  m = /^(\d{1,2})[./](\d{1,2})[./](\d{4})$/.exec(s);
  if (m) return monthOf(Number(m[3]), Number(m[2]), Number(m[1]));
  if (/^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}/.test(s)) {
    const hasZone = /(Z|[+-]\d{2}:?\d{2})$/.test(s);
    if (!hasZone) return monthOf(Number(s.slice(0, 4)), Number(s.slice(5, 7)), Number(s.slice(8, 10)));
    const date = new Date(s.replace(' ', 'T'));
    if (Number.isNaN(date.getTime())) return undefined;
    const parts = new Intl.DateTimeFormat('en-CA', {
      timeZone,
      year: 'numeric',
      month: '2-digit'
    }).formatToParts(date);
    const year = parts.find((p) => p.type === 'year')?.value;
    const month = parts.find((p) => p.type === 'month')?.value;
    return year && month ? `${year}-${month}` : undefined;
  }
  return undefined;
}

function monthOf(year: number, month: number, day: number): string | undefined {
  if (month < 1 || month > 12 || day < 1 || day > 31) return undefined;
  const d = new Date(Date.UTC(year, month - 1, day));
  if (d.getUTCMonth() !== month - 1) return undefined;
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}`;
}
