import { describe, expect, it } from 'vitest';
import { parseLocaleNumber } from './locale-number';

describe('locale number parsing', () => {
  it.each([
    ['1.234,5', 1234.5],
    ['1,234.5', 1234.5],
    ['-0,5', -0.5],
    ['1e-3', 0.001],
    ['2,5E+2', 250],
    ['12', 12],
    ['1 234,5', 1234.5],
    ["1'234.5", 1234.5],
    ['+3.25', 3.25],
    ['−4,75', -4.75],
    ['.5', 0.5],
    ['1,234', 1234]
  ])('reads %j as %d', (text, value) => {
    expect(parseLocaleNumber(text)).toBe(value);
  });

  it.each(['', '   ', 'NaN', '∞', 'Infinity', 'abc', '1.2.3', '12,34,5', '1e', '--1', '0x10'])(
    'refuses %j',
    (text) => {
      expect(parseLocaleNumber(text)).toBeUndefined();
    }
  );

  it('follows a stated decimal mark', () => {
    expect(parseLocaleNumber('1,234', ',')).toBe(1.234);
    expect(parseLocaleNumber('1.234', ',')).toBe(1234);
    expect(parseLocaleNumber('1,5', '.')).toBeUndefined();
  });
});

describe('the decimal mark of a locale', () => {
  it('reads 0,015 as a decimal comma even without a stated mark', () => {
    expect(parseLocaleNumber('0,015')).toBe(0.015);
  });
});

describe('decimalMarkOf', () => {
  it('follows Intl for common locales', async () => {
    const { decimalMarkOf } = await import('./locale-number');
    expect(decimalMarkOf('de-DE')).toBe(',');
    expect(decimalMarkOf('en-US')).toBe('.');
    expect(decimalMarkOf('fr-FR')).toBe(',');
  });
});
