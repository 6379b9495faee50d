import { describe, expect, it } from 'vitest';
import { checkValues, expectAbsolute, expectRelative } from '../../../tests/support/reference-data';
import { analyzeDefectives, analyzeDefects } from './analyze-counts';
import { clopperPearson, poissonCountInterval } from './confidence-bounds';
import { normalUpperQuantile } from './normal-distribution';

const ref = checkValues().binomial_poisson_limits;

describe('Clopper–Pearson interval', () => {
  const published =
    ref.clopper_pearson[
      "published_R_binom.test_outputs(as reproduced on a blog page, 'r binom test confidence interval', Nov 13 2020)"
    ];
  it('x = 9, n = 24 at 95 % (R binom.test, 7 digits)', () => {
    const ci = clopperPearson(9, 24, 0.95);
    expectRelative(ci.lower, published['x=9,n=24,95%'][0], 5e-7);
    expectRelative(ci.upper, published['x=9,n=24,95%'][1], 5e-7);
  });
  it('x = 1, n = 1497 at 90 % (R binom.test, 7 digits)', () => {
    const ci = clopperPearson(1, 1497, 0.9);
    expectRelative(ci.lower, published['x=1,n=1497,90%'][0], 5e-7);
    expectRelative(ci.upper, published['x=1,n=1497,90%'][1], 5e-7);
  });
  it('x = 0, n = 100: two-sided upper and one-sided upper bound (scipy)', () => {
    const ci = clopperPearson(0, 100, 0.95);
    expect(ci.lower).toBe(0);
    expectRelative(ci.upper, ref.clopper_pearson.computed_scipy['x=0,n=100,95%_two_sided'][1], 1e-9);
    expectRelative(ci.upperBound, ref.clopper_pearson.computed_scipy['x=0,n=100,one_sided_95%_upper'], 1e-12);
  });
  it('the zero-defect bound agrees with the rule of three (Hanley & Lippman-Hand 1983) and its exact form', () => {
    for (const n of [300, 1500]) {
      const ub = clopperPearson(0, n, 0.95).upperBound;
      expectRelative(ub, ref.rule_of_three.computed['exact_binomial_upper_95%_one_sided'][`n=${n}`], 1e-12);
      expectRelative(ub, 3 / n, 0.01);
    }
  });
});

describe('exact Poisson limits', () => {
  const pub = ref.poisson_exact_chisq.published;
  it.each([
    ['90%', 0.9],
    ['95%', 0.95],
    ['99%', 0.99]
  ])('x = 42 at %s (published to 2 decimals)', (key, level) => {
    const ci = poissonCountInterval(42, level);
    const [lo, hi] = pub["x=42 (blog 'Poisson Confidence Intervals in R')"][key];
    expectAbsolute(ci.lower, lo, 0.005);
    expectAbsolute(ci.upper, hi, 0.005);
    const sc = ref.poisson_exact_chisq.computed_scipy['x=42'][key];
    expectRelative(ci.lower, sc[0], 1e-9);
    expectRelative(ci.upper, sc[1], 1e-9);
  });
  it('x = 0: 3.689 two-sided and 2.996 one-sided upper at 95 % (R epitools)', () => {
    const ci = poissonCountInterval(0, 0.95);
    expectAbsolute(ci.upper, 3.689, 5e-4);
    expectAbsolute(ci.upperBound, 2.996, 5e-4);
  });
});

describe('counted studies', () => {
  it('defectives: p, ppm, yield and z-level', () => {
    const r = analyzeDefectives(2000, 7);
    expectRelative(r.p, 0.0035, 1e-15);
    expectRelative(r.ppm, 3500, 1e-12);
    expectRelative(r.yield, 0.9965, 1e-15);
    expectRelative(r.zLevel, normalUpperQuantile(0.0035), 1e-15);
    expect(r.intervals.p!.lower).toBeLessThan(0.0035);
    expect(r.assumptions.join(' ')).toMatch(/binomial/);
  });

  it('zero defectives gives a finite z-level from the upper bound, never infinity', () => {
    const r = analyzeDefectives(300, 0);
    expect(Number.isFinite(r.zLevel)).toBe(true);
    expectRelative(
      r.zLevel,
      normalUpperQuantile(ref.rule_of_three.computed['exact_binomial_upper_95%_one_sided']['n=300']),
      1e-12
    );
    expect(r.assumptions.join(' ')).toMatch(/lower bound/);
  });

  it('defects with opportunities: DPU, DPMO, first-pass yield e^(−DPU), z-level from DPMO', () => {
    const r = analyzeDefects(500, 12, 8);
    expectRelative(r.dpu, 0.024, 1e-15);
    expectRelative(r.dpmo, 3000, 1e-12);
    expectRelative(r.yield, Math.exp(-0.024), 1e-15);
    expectRelative(r.zLevel, normalUpperQuantile(0.003), 1e-15);
    expect(r.assumptions.join(' ')).toMatch(/independently/);
    expect(Number.isFinite(analyzeDefects(500, 0, 8).zLevel)).toBe(true);
  });

  it('refuses impossible counts with a message that says which', () => {
    expect(() => analyzeDefectives(10, 11)).toThrow(/Defectives \(11\) cannot exceed units inspected \(10\)/);
    expect(() => analyzeDefectives(10, -1)).toThrow(/whole number ≥ 0/);
    expect(() => analyzeDefects(10, 41, 4)).toThrow(/cannot exceed the opportunities \(10 × 4 = 40\)/);
    expect(() => analyzeDefects(0, 0)).toThrow(/≥ 1/);
  });
});
