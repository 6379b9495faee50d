import { describe, expect, it } from 'vitest';
import { rulingText } from './portfolio-format';

describe('the ruling figure of a row', () => {
  it('names the index, or for counted data the z-level and the index it stands for', () => {
    expect(
      rulingText({ estimate: 1.1234, bound: 0.98, required: 1.33, result: { cpk: 1.1234 } }, 'index')
    ).toBe('Cpk 1.12 (bound 0.98) vs ≥ 1.33');
    expect(
      rulingText({ estimate: 3.9, bound: 3.5, required: 1.33, requiredZ: 3.99, result: {} }, 'index')
    ).toBe('z 3.90 (bound 3.50) vs ≥ 3.99 (3 × index 1.33)');
  });

  it('writes a ppm requirement as defective ppm, grouped, without scientific notation', () => {
    expect(rulingText({ estimate: 2865.2, bound: 30512, required: 1000 }, 'ppm')).toBe(
      '2,865 ppm defective (bound 30,512 ppm) vs ≤ 1,000 ppm'
    );
    expect(rulingText({ estimate: 0.0016, required: 1 }, 'ppm')).toBe('< 0.01 ppm defective vs ≤ 1.0 ppm');
  });
});
