import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatParameter } from './models/fitted-model';
import { plainPValue, plainSignificant } from './plain-number';

describe("numbers in the engine's own words", () => {
  it('are positional, never in exponent form, and keep their significant digits', () => {
    expect(plainSignificant(0.0000123456, 3)).toBe('0.0000123');
    expect(plainSignificant(30512.7, 3)).toBe('30500');
    expect(plainSignificant(0.0996, 2)).toBe('0.10');
    expect(plainPValue(0.00001)).toBe('< 0.001');
    expect(plainPValue(0.0423)).toBe('0.042');
    expect(formatParameter(1.2e-7)).toBe('0.00000012');
    expect(formatParameter(2.5)).toBe('2.5');
    fc.assert(
      fc.property(fc.double({ min: 1e-12, max: 1e15, noNaN: true }), (v) => {
        expect(plainSignificant(v, 3)).not.toMatch(/e/i);
        expect(Number(plainSignificant(v, 3))).toBeCloseTo(Number(v.toPrecision(3)), 10);
      })
    );
  });
});
