import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isDeviceId } from './device-id';
import {
  checkedStampNames,
  checkedStampWallMs,
  formatStamp,
  parseStamp,
  STAMP_PATTERN
} from './hybrid-clock';

/** The reading by expression that parseStamp replaced, kept here as its specification. */
function byPattern(stamp: string) {
  const m = STAMP_PATTERN.exec(stamp);
  if (!m || !isDeviceId(m[3])) return undefined;
  return { wallMs: Number(m[1]), counter: Number(m[2]), deviceId: m[3] as string };
}

describe('reading a clock stamp', () => {
  it('reads exactly what the stamp pattern with a device id after it reads, on stamps and near-stamps', () => {
    const digits = (n: number) =>
      fc.string({ unit: fc.constantFrom(...'0123456789'), minLength: n, maxLength: n });
    const near = fc
      .tuple(
        fc.oneof(digits(13), digits(12), digits(14), fc.string({ maxLength: 14 })),
        fc.constantFrom('-', '_', ''),
        fc.oneof(digits(4), digits(3), digits(5), fc.string({ maxLength: 5 })),
        fc.constantFrom('-', '', '--'),
        fc.oneof(
          fc.string({ unit: fc.constantFrom(...'abcdef0123456789-'), maxLength: 90 }),
          fc.constantFrom('constructor', 'toString', 'A1', 'a\n', '-a', 'x'.repeat(80), 'x'.repeat(81)),
          fc.string({ maxLength: 12 })
        )
      )
      .map((parts) => parts.join(''));
    fc.assert(
      fc.property(fc.oneof(near, fc.string({ maxLength: 40 })), (s) => {
        expect(parseStamp(s)).toEqual(byPattern(s));
      }),
      { numRuns: 5000 }
    );
    // Hand-picked: a valid stamp, a line break inside, digits beyond ASCII.
    expect(parseStamp('1764633600000-0003-site-a')).toEqual({
      wallMs: 1764633600000,
      counter: 3,
      deviceId: 'site-a'
    });
    expect(parseStamp('1764633600000-0003-site\na')).toBeUndefined();
    expect(parseStamp('176463360000٠-0003-site-a')).toBeUndefined();
  });
});

describe('reading a stamp already checked', () => {
  it("gives parseStamp's wall-clock time and writer on every stamp (property)", () => {
    const deviceId = fc.oneof(
      fc.string({ unit: fc.constantFrom(...'abcdef0123456789-'), minLength: 1, maxLength: 40 }),
      fc.constantFrom('site-a', 'site-ab', 'site', 'a')
    );
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 9_999_999_999_999 }),
        fc.integer({ min: 0, max: 9999 }),
        deviceId,
        deviceId,
        (wallMs, counter, writer, other) => {
          const stamp = formatStamp({ wallMs, counter, deviceId: writer });
          const parts = parseStamp(stamp);
          if (!parts) return; // not a stamp (a device id the rule refuses): never checked
          expect(checkedStampWallMs(stamp)).toBe(parts.wallMs);
          expect(checkedStampNames(stamp, writer)).toBe(true);
          expect(checkedStampNames(stamp, other)).toBe(parts.deviceId === other);
        }
      ),
      { numRuns: 3000, seed: 20261205 }
    );
  });
});
