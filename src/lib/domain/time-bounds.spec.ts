import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  calendarTimeMs,
  CLOCK_TOLERANCE_MS,
  generalTimeMs,
  isAheadOfClock,
  timeAheadOfClock
} from './time-bounds';

const pad = (n: number, w: number) => String(n).padStart(w, '0');

/**
 * Stamps in the form Capstan writes, from year `from` to `to`, with digits in and beyond their ranges (day 31 of a
 * 30-day month, 29 February, hour 24), as a damaged file has them.
 */
function writtenStamps(from: number, to: number): fc.Arbitrary<string> {
  return fc
    .record({
      y: fc.integer({ min: from, max: to }),
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
}

describe('reading time stamps', () => {
  it('reads the form Capstan writes by character codes exactly as the general reading does (property)', () => {
    const stamp = writtenStamps(1890, 2310);
    fc.assert(
      fc.property(stamp, (text) => {
        expect(calendarTimeMs(text)).toBe(generalTimeMs(text));
      }),
      { numRuns: 3000, seed: 7 }
    );
  });

  it('finds a time stamp ahead of a clock exactly as reading it does, by its text where it can (property)', () => {
    // Stamps in the written form, in and out of range, and in the general forms (offsets, no milliseconds).
    const written = writtenStamps(1995, 2205);
    const general = fc
      .tuple(
        fc.integer({ min: Date.UTC(2000, 0, 1), max: Date.UTC(2199, 11, 31) }),
        fc.integer({ min: -14, max: 14 })
      )
      .map(([ms, hours]) => {
        const local = new Date(ms + hours * 3_600_000).toISOString().slice(0, 19);
        const sign = hours < 0 ? '-' : '+';
        return `${local}${sign}${pad(Math.abs(hours), 2)}:00`;
      });
    const text = fc.oneof(written, general, fc.string({ maxLength: 26 }));
    // Clocks near the stamp (either side of the tolerance, to the millisecond) and anywhere in the span.
    const clock = (t: string) =>
      fc.oneof(
        fc.integer({ min: -3 * CLOCK_TOLERANCE_MS, max: 3 * CLOCK_TOLERANCE_MS }).map((offset) => {
          const at = calendarTimeMs(t) ?? Date.UTC(2026, 11, 4);
          return at - CLOCK_TOLERANCE_MS + offset;
        }),
        fc.constantFrom(-1, 0.5, 1e15),
        fc.double({ min: Date.UTC(1999, 0, 1), max: Date.UTC(2201, 0, 1), noNaN: true })
      );
    fc.assert(
      fc.property(
        text.chain((t) => fc.tuple(fc.constant(t), clock(t))),
        ([t, nowMs]) => {
          const ms = calendarTimeMs(t);
          const expected = ms !== undefined && isAheadOfClock(ms, nowMs) ? ms : undefined;
          expect(timeAheadOfClock(nowMs)(t)).toBe(expected);
        }
      ),
      { numRuns: 5000, seed: 12 }
    );
    // At the limit to the millisecond: not ahead; one millisecond past it: ahead.
    const at = Date.UTC(2026, 11, 4, 18, 0, 0, 250);
    const stamp = new Date(at).toISOString();
    expect(timeAheadOfClock(at - CLOCK_TOLERANCE_MS)(stamp)).toBeUndefined();
    expect(timeAheadOfClock(at - CLOCK_TOLERANCE_MS - 1)(stamp)).toBe(at);
    expect(timeAheadOfClock(at - CLOCK_TOLERANCE_MS - 0.5)(stamp)).toBe(at);
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
