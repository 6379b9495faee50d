import { describe, expect, it } from 'vitest';
import { analyzeMeasured } from '../stats/analyze-measured';
import { entryFlags } from './entry-flags';

describe('entry flags', () => {
  it('flags instability and physical bounds, not a calm small sample', () => {
    const calm = Array.from({ length: 30 }, (_, i) => 10 + (i % 2 ? 0.1 : -0.1) * (1 + (i % 3) * 0.2));
    expect(entryFlags(analyzeMeasured(calm, { spec: { lsl: 9, usl: 11 }, model: 'normal' }))).toEqual([]);
    const shifted = [...calm];
    shifted[15] = 14;
    shifted[3] = -1;
    const flags = entryFlags(
      analyzeMeasured(shifted, { spec: { lsl: 9, usl: 11 }, model: 'normal', physicalMin: 0 })
    );
    expect(flags).toContain('not shown to be stable');
    expect(flags).toContain('values outside physical bounds');
  });
});
