import { describe, expect, it } from 'vitest';
import {
  checkValues,
  expectAbsolute,
  expectRelative,
  furnaceThickness,
  nistCertified,
  nistValues
} from '../../../tests/support/reference-data';
import { andersonDarlingNormal, andersonDarlingNormalP } from './anderson-darling';
import { mean, sampleSd } from './moments';
import { sortedCopy } from './quantiles';

const ad = checkValues().anderson_darling;

function test(values: number[]) {
  return andersonDarlingNormal(sortedCopy(values), mean(values), sampleSd(values));
}

describe('Anderson–Darling normality test', () => {
  it('reproduces the NAG g08ckc worked example (A² 0.165956, A²* 0.171296, p 0.931155; 6 decimals)', () => {
    const ex = ad.published_worked_example;
    const r = test(ex.data);
    expectAbsolute(r.ad, ex.A2, 5e-7);
    expectAbsolute(r.adAdjusted, ex.A2_star, 5e-7);
    expectAbsolute(r.p, ex.upper_tail_p, 5e-7);
  });

  it('matches scipy.stats.anderson on the furnace data, with the D’Agostino–Stephens p-value', () => {
    const r = test(furnaceThickness());
    expectRelative(r.ad, ad.furnace.A2_scipy, 1e-10);
    expectRelative(r.adAdjusted, ad.furnace.A2_star, 1e-10);
    expectRelative(r.p, ad.furnace.p_DAgostinoStephens, 1e-10);
  });

  it.each(['Lottery', 'Lew', 'Michelso', 'PiDigits'])('matches scipy on NIST StRD %s', (name) => {
    const ref = nistCertified()[name]!.anderson_darling_normal_computed_scipy_1_17!;
    const r = test(nistValues(name));
    expectRelative(r.ad, ref.A2, 1e-9);
    expectRelative(r.p, ref.p_DAgostino_Stephens, 1e-6);
  });

  it('uses each branch of Table 4.9 and stays within [0, 1]', () => {
    expect(andersonDarlingNormalP(0.1)).toBeGreaterThan(0.9);
    expect(andersonDarlingNormalP(0.3)).toBeGreaterThan(andersonDarlingNormalP(0.5));
    expectAbsolute(andersonDarlingNormalP(0.752), 0.05, 0.002); // the tabled 5 % point
    expect(andersonDarlingNormalP(50)).toBeGreaterThanOrEqual(0);
  });
});
