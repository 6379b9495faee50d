import { describe, expect, it } from 'vitest';
import { formatIndex, formatPpm, formatYield } from './capability-format';

describe('figure formatting', () => {
  it('writes ppm, yield and indices with digits that fit their size', () => {
    expect(formatPpm(91.42573)).toBe('91.4');
    expect(formatPpm(3.39767)).toBe('3.40');
    expect(formatPpm(0.0029)).toBe('2.9e-3');
    expect(formatPpm(undefined)).toBe('–');
    expect(formatYield(0.9999085742)).toBe('99.991 %');
    expect(formatYield(0.6827)).toBe('68.27 %');
    expect(formatIndex(1.273265)).toBe('1.27');
    expect(formatIndex(Infinity)).toBe('∞');
  });
});
