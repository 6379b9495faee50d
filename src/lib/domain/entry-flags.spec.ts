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

describe('flags read warning codes, never the wording', () => {
  it('flags a value outside the physical bounds by its code, whatever the sentence says', () => {
    const r = analyzeMeasured([-0.1, 0.2, 0.3, 0.25, 0.22, 0.31, 0.28, 0.27], {
      spec: { usl: 0.4 },
      physicalMin: 0
    });
    expect(r.warningCodes).toContain('below-physical-minimum');
    const reworded = { ...r, warnings: r.warnings.map(() => 'some other wording') };
    expect(entryFlags(reworded)).toContain('values outside physical bounds');
  });
});
