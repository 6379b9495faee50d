import { describe, expect, it } from 'vitest';
import { checkValues, expectRelative } from '../../../tests/support/reference-data';
import {
  consecutiveSubgroups,
  defaultEstimator,
  groupBySubgroup,
  meanMovingRange,
  pooledSd,
  sigmaFromMovingRange,
  sigmaFromRanges,
  sigmaFromSubgroupSds,
  withinSigma
} from './sigma-estimators';

/**
 * Within-subgroup sigma estimators, checked against the control-chart constants as computed from their
 * definitions (tests/fixtures/check-values.json, scipy: d2 and c4 by numeric integration) and hand-worked sets.
 */
const constants = checkValues().control_chart_constants.computed_scipy as Record<
  string,
  { d2: number; c4: number }
>;

const groups = [
  [10.1, 10.3, 9.9, 10.0, 10.2],
  [9.8, 10.0, 10.1, 9.9, 10.0],
  [10.4, 10.2, 10.3, 10.1, 10.5]
];

describe('within-subgroup sigma', () => {
  it('R̄/d2: mean range over d2(5)', () => {
    // Ranges 0.4, 0.3, 0.4 → R̄ = 0.36667; d2(5) = 2.32593.
    expectRelative(sigmaFromRanges(groups), (0.4 + 0.3 + 0.4) / 3 / constants['5']!.d2, 1e-3);
  });

  it('S̄/c4: mean subgroup sd over c4(5)', () => {
    const sd = (g: number[]) => {
      const m = g.reduce((a, b) => a + b, 0) / g.length;
      return Math.sqrt(g.reduce((a, b) => a + (b - m) ** 2, 0) / (g.length - 1));
    };
    const sBar = groups.map(sd).reduce((a, b) => a + b, 0) / groups.length;
    expectRelative(sigmaFromSubgroupSds(groups), sBar / constants['5']!.c4, 1e-3);
  });

  it('pooled sd: √(Σ(nᵢ − 1)sᵢ² / Σ(nᵢ − 1)), equal to the rms of the sds for equal sizes', () => {
    // Subgroup variances 0.025, 0.0130, 0.025 (hand-worked): pooled √(0.021) = 0.14491.
    expectRelative(pooledSd(groups), Math.sqrt((0.025 + 0.013 + 0.025) / 3), 1e-9);
  });

  it('MR̄/d2(2) for individuals', () => {
    const x = [5, 7, 6, 9, 8];
    // Moving ranges 2, 1, 3, 1 → MR̄ = 1.75; d2(2) = 1.12838 (= 2/√π). The engine uses the published
    // three-decimal table (1.128), so the two agree to 1e-3.
    expect(meanMovingRange(x)).toBe(1.75);
    expectRelative(sigmaFromMovingRange(x), 1.75 / constants['2']!.d2, 1e-3);
  });

  it('groups values by id or in consecutive runs, and picks the default estimator by subgroup shape', () => {
    expect(groupBySubgroup([1, 2, 3, 4], ['a', 'b', 'a', 'b'])).toEqual([
      [1, 3],
      [2, 4]
    ]);
    expect(consecutiveSubgroups([1, 2, 3, 4, 5], 2)).toEqual([
      [1, 2],
      [3, 4]
    ]);
    expect(defaultEstimator(undefined)).toBe('moving-range');
    expect(defaultEstimator(groups)).toBe('rbar');
    expect(defaultEstimator([Array(12).fill(1), Array(12).fill(2)])).toBe('sbar');
    expect(
      defaultEstimator([
        [1, 2],
        [1, 2, 3]
      ])
    ).toBe('pooled');
    expect(withinSigma('pooled', groups.flat(), groups)).toBe(pooledSd(groups));
  });
});
