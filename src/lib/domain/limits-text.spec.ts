import { describe, expect, it } from 'vitest';
import { limitsText } from './limits-text';

describe('a specification in words', () => {
  it('names only the limits there are, each as entered', () => {
    expect(limitsText({ lsl: 9.5, target: 10, usl: 10.55 })).toBe('LSL 9.5 · target 10 · USL 10.55');
    expect(limitsText({ usl: 0.4 })).toBe('USL 0.4');
    expect(limitsText({})).toBe('no limits');
    expect(limitsText({ lsl: 1e-7, usl: 12000 })).toBe('LSL 0.0000001 · USL 12,000');
    expect(limitsText({ lsl: 1, usl: 2 }, undefined, ', ')).toBe('LSL 1, USL 2');
  });
});
