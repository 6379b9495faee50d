import { describe, expect, it } from 'vitest';
import { formatIndex, formatPpm, formatYield } from './capability-format';

// The policy itself is tested in domain/figure-format.spec.ts; this checks the pages get it in their locale
// (the test runner's, English here).
describe('figure formatting on the pages', () => {
  it('writes ppm, yield and indices by the figure policy, thousands grouped', () => {
    expect(formatPpm(2865.4)).toBe('2,865');
    expect(formatPpm(3.39767)).toBe('3.4');
    expect(formatPpm(0.0029)).toBe('< 0.01');
    expect(formatYield(0.9999085742)).toBe('99.9909 %');
    expect(formatIndex(1.273265)).toBe('1.27');
  });
});
