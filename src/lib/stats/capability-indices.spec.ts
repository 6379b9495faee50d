import { describe, expect, it } from 'vitest';
import { checkValues, expectAbsolute } from '../../../tests/support/reference-data';
import { cpm, indices } from './capability-indices';

/** Direct checks of the index formulas against the NIST/SEMATECH e-Handbook furnace case study (§3.5.1.2). */
const furnace = checkValues().furnace_case_study;
const pub = furnace.published;
const spec = { lsl: furnace.spec.LSL, usl: furnace.spec.USL, target: furnace.spec.target };

describe('capability indices', () => {
  it('reproduce the published CP, CPL, CPU, CPK and CPM from the published mean and sd (5 printed decimals)', () => {
    // The printed mean and sd are rounded to 5 decimals, so the indices agree to about 1e-5.
    const i = indices(pub.mean, pub.sd, spec);
    expectAbsolute(i.spread, pub.CP, 2e-5, 'CP');
    expectAbsolute(i.lower, pub.CPL, 2e-5, 'CPL');
    expectAbsolute(i.upper, pub.CPU, 2e-5, 'CPU');
    expectAbsolute(i.k, pub.CPK, 2e-5, 'CPK');
    expectAbsolute(cpm(pub.mean, pub.sd, spec), pub.CPM, 2e-5, 'CPM');
  });

  it('leave out what a one-sided specification cannot have, and never divide by a zero sigma', () => {
    expect(indices(10, 1, { usl: 13 })).toEqual({ upper: 1, k: 1 });
    expect(indices(10, 1, { lsl: 4 })).toEqual({ lower: 2, k: 2 });
    expect(indices(10, 0, { lsl: 4, usl: 16 })).toEqual({});
    expect(cpm(10, 1, { lsl: 4, usl: 16 })).toBeUndefined();
  });

  it('Cpk = Cp when centred, and Cpm = Cp on target (by the formulas, hand-checked)', () => {
    const i = indices(10, 0.5, { lsl: 7, usl: 13 });
    expect(i.spread).toBe(2);
    expect(i.k).toBe(2);
    expect(cpm(10, 0.5, { lsl: 7, usl: 13, target: 10 })).toBe(2);
    // Off target by one sigma: Cpm = Cp/√2.
    expect(cpm(10.5, 0.5, { lsl: 7, usl: 13, target: 10 })).toBeCloseTo(2 / Math.SQRT2, 14);
  });
});
