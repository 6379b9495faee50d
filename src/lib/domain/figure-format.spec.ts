import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  countOf,
  formatIndex,
  formatMeasured,
  formatPpm,
  formatSignificant,
  formatStatistic,
  formatYield,
  plainYieldFraction,
  PLAIN,
  PRINTED,
  resolutionOf
} from './figure-format';

/** Scientific notation as a number formatter or toString writes it: a digit, then e or E, then an exponent. */
const SCIENTIFIC = /\d(\.\d+)?[eE][+-]?\d/;

describe('the figure policy', () => {
  it('writes indices and z-levels to 2 decimals', () => {
    expect(formatIndex(1.273265, PRINTED)).toBe('1.27');
    expect(formatIndex(4.4998544700250065, PRINTED)).toBe('4.50');
    expect(formatIndex(5.999999999999999, PRINTED)).toBe('6.00');
    expect(formatIndex(Infinity)).toBe('∞');
    expect(formatIndex(undefined)).toBe('–');
  });

  it('writes ppm grouped from 100, to 2 significant digits below, and "< 0.01" below that', () => {
    expect(formatPpm(2865.4, PRINTED)).toBe('2,865');
    expect(formatPpm(30_512.7, PRINTED)).toBe('30,513');
    expect(formatPpm(91.42573, PRINTED)).toBe('91');
    expect(formatPpm(3.39767, PRINTED)).toBe('3.4');
    expect(formatPpm(0.0016, PRINTED)).toBe('< 0.01');
    expect(formatPpm(0.016, PRINTED)).toBe('0.016');
    expect(formatPpm(0.0996, PRINTED)).toBe('0.10');
    expect(formatPpm(99.7, PRINTED)).toBe('100');
    expect(formatPpm(0)).toBe('0');
    expect(formatPpm(30_512.7, PLAIN)).toBe('30513');
  });

  it('gives a yield the decimals its loss needs, never 100.00000 % nor 0.00000 %', () => {
    // 3.4 ppm beside 99.99966 % is the pairing tabulated for a 6σ short-term level (common practice).
    expect(formatYield(1 - 3.4e-6, PRINTED)).toBe('99.99966 %');
    expect(formatYield(1 - 2865e-6, PRINTED)).toBe('99.71 %');
    expect(formatYield(0.6827, PRINTED)).toBe('68.3 %');
    expect(formatYield(0.0999996, PRINTED)).toBe('10.0 %');
    expect(formatYield(1 - 1.6e-9, PRINTED)).toBe('> 99.99999 %');
    expect(formatYield(1 - 4e-8, PRINTED)).toBe('> 99.99999 %');
    expect(formatYield(2e-7, PRINTED)).toBe('< 0.1 %');
    expect(formatYield(1, PRINTED)).toBe('100 %');
    expect(formatYield(undefined)).toBe('–');
  });

  it('writes the CSV yield as a fraction at the same resolution, never rounded up to 1', () => {
    expect(plainYieldFraction(1 - 2865e-6)).toBe('0.9971');
    expect(plainYieldFraction(1 - 3.4e-6)).toBe('0.9999966');
    expect(plainYieldFraction(1 - 1.6e-9)).toBe('0.9999999');
    expect(plainYieldFraction(1)).toBe('1');
  });

  it('never writes scientific notation, for any figure however small or large', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-300, max: 1e15, noNaN: true }), (v) => {
        for (const text of [
          formatPpm(v),
          formatIndex(v),
          formatSignificant(v, 3),
          formatYield(Math.min(1, v / 1e15)),
          formatYield(1 - Math.min(1, v / 1e15)),
          formatMeasured(v, 4)
        ])
          expect(text).not.toMatch(SCIENTIFIC);
      }),
      { numRuns: 2000 }
    );
  });

  it('takes the resolution of measured data from the values as written', () => {
    expect(resolutionOf([10.2, 9.85, 10])).toBe(2);
    expect(resolutionOf([12, 13])).toBe(0);
    expect(resolutionOf([1e-7])).toBe(7);
    expect(formatMeasured(10.2, 2, PRINTED)).toBe('10.20');
    // A mean and an sd of data read to 0.01: one decimal more, the same for both.
    expect(formatStatistic(10.023456789, 2, PRINTED)).toBe('10.023');
    expect(formatStatistic(0.41234, 2, PRINTED)).toBe('0.412');
  });

  it('puts a count and its noun in the same number', () => {
    expect(countOf(1, 'study', 'studies')).toBe('1 study');
    expect(countOf(2, 'site', 'sites')).toBe('2 sites');
    expect(countOf(0, 'process', 'processes')).toBe('0 processes');
    expect(countOf(12_000, 'study', 'studies', PRINTED)).toBe('12,000 studies');
  });
});
