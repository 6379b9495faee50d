import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { calendarTimeMs, generalTimeMs } from './time-bounds';

describe('reading time stamps', () => {
  it('reads the form Capstan writes by character codes exactly as the general reading does (property)', () => {
    const pad = (n: number, w: number) => String(n).padStart(w, '0');
    // Digits in and beyond their ranges (day 31 of a 30-day month, 29 February, hour 24), as a damaged file has.
    const stamp = fc
      .record({
        y: fc.integer({ min: 1890, max: 2310 }),
        mo: fc.integer({ min: 0, max: 13 }),
        d: fc.integer({ min: 0, max: 32 }),
        h: fc.integer({ min: 0, max: 25 }),
        mi: fc.integer({ min: 0, max: 61 }),
        s: fc.integer({ min: 0, max: 61 }),
        ms: fc.integer({ min: 0, max: 999 })
      })
      .map(
        ({ y, mo, d, h, mi, s, ms }) =>
          `${pad(y, 4)}-${pad(mo, 2)}-${pad(d, 2)}T${pad(h, 2)}:${pad(mi, 2)}:${pad(s, 2)}.${pad(ms, 3)}Z`
      );
    fc.assert(
      fc.property(stamp, (text) => {
        expect(calendarTimeMs(text)).toBe(generalTimeMs(text));
      }),
      { numRuns: 3000, seed: 7 }
    );
  });

  it('agrees with the calendar on leap days and the edges of the span (Gregorian rules)', () => {
    expect(calendarTimeMs('2024-02-29T00:00:00.000Z')).toBe(Date.UTC(2024, 1, 29));
    expect(calendarTimeMs('2100-02-29T00:00:00.000Z')).toBeUndefined(); // a century, not divisible by 400
    expect(calendarTimeMs('2000-02-29T12:00:00.500Z')).toBe(Date.UTC(2000, 1, 29, 12, 0, 0, 500));
    expect(calendarTimeMs('1999-12-31T23:59:59.999Z')).toBeUndefined(); // before the span
    expect(calendarTimeMs('2200-01-01T00:00:00.000Z')).toBeUndefined(); // after it
    expect(calendarTimeMs('2026-11-03T08:15:00+01:00')).toBe(Date.UTC(2026, 10, 3, 7, 15)); // general form
    expect(calendarTimeMs('2026-11-03T08:15:0x.000Z')).toBeUndefined();
  });
});
