import { WarningList } from './result-warnings';
import type { CapabilityResult } from './capability-result';
import {
  clopperPearson,
  clopperPearsonUpperBound,
  poissonCountInterval,
  poissonCountUpperBound
} from './confidence-bounds';
import { normalUpperQuantile } from './normal-distribution';
import { plainSignificant } from './plain-number';

export interface CountOptions {
  confidence?: number;
  shortTermShift?: number;
}

function checkLevel(level: number): void {
  if (!(level > 0 && level < 1))
    throw new RangeError(`A confidence level strictly between 0 and 1 is needed (got ${level})`);
}

function shift(result: CapabilityResult, options: CountOptions): CapabilityResult {
  if (options.shortTermShift !== undefined) {
    result.zLevelShortTerm = result.zLevel + options.shortTermShift;
    result.assumptions.push(
      `short-term sigma level = z-level + ${options.shortTermShift} (shift convention), reported because it was asked for`
    );
  }
  return result;
}

/**
 * Defectives out of units inspected (binomial): p = d/n, ppm = 10⁶·p, yield = 1 − p, z-level = Q⁻¹(p), with the
 * exact Clopper–Pearson interval. With no defective the z-level is the one at the one-sided upper bound of p
 * (≈ 3/n at 95 %, the rule of three), never infinite.
 */
export function analyzeDefectives(
  units: number,
  defectives: number,
  options: CountOptions = {}
): CapabilityResult {
  checkDefectives(units, defectives);
  const level = options.confidence ?? 0.95;
  checkLevel(level);
  const ci = clopperPearson(defectives, units, level);
  const { p, zLevel, zLevelLower } = defectivesFigures(units, defectives, ci.upperBound);
  const assumptions = [
    'counted data: each unit is defective or not, independently and with the same probability (binomial)',
    `interval: exact Clopper–Pearson at ${Math.round(level * 1000) / 10} %`
  ];
  const warnings = new WarningList();
  const zero = defectives === 0;
  if (zero) {
    assumptions.push(
      `no defective seen: the z-level shown is the lower bound, from the one-sided upper bound p ≤ ${plainSignificant(ci.upperBound, 3)}`
    );
  }
  if (units < 100)
    warnings.add('few-units', `Only ${units} units inspected: the interval on the defective rate is wide`);
  const result: CapabilityResult = {
    kind: 'defectives',
    n: units,
    p,
    ppm: p * 1e6,
    ppmTotal: p * 1e6,
    yield: 1 - p,
    zLevel,
    model: 'binomial',
    modelLabel: 'binomial count of defectives',
    method: 'fraction defective d/n; z-level = Q⁻¹(p)',
    assumptions,
    warnings: warnings.texts,
    warningCodes: warnings.codes,
    intervals: {
      p: { lower: ci.lower, upper: ci.upper, upperBound: ci.upperBound, level },
      ppm: { lower: ci.lower * 1e6, upper: ci.upper * 1e6, upperBound: ci.upperBound * 1e6, level },
      zLevel: {
        lower: normalUpperQuantile(ci.upper),
        upper: ci.lower === 0 ? Infinity : normalUpperQuantile(ci.lower),
        lowerBound: zLevelLower,
        level
      }
    }
  };
  return shift(result, options);
}

/** The checks analyzeDefectives makes of its counts; RangeError with what is wrong. */
function checkDefectives(units: number, defectives: number): void {
  if (!(Number.isInteger(units) && units >= 1))
    throw new RangeError(`Units inspected must be a whole number ≥ 1, got ${units}`);
  if (!(Number.isInteger(defectives) && defectives >= 0))
    throw new RangeError(`Defectives must be a whole number ≥ 0, got ${defectives}`);
  if (defectives > units)
    throw new RangeError(`Defectives (${defectives}) cannot exceed units inspected (${units})`);
}

/**
 * The figures of a count of defectives, given the one-sided upper bound of p (clopperPearsonUpperBound): p, the
 * z-level (at the bound when none was seen) and the z-level's lower bound. The one home of these rules, for the
 * full analysis and for a portfolio's window figures (domain/window-figures.ts).
 */
function defectivesFigures(
  units: number,
  defectives: number,
  pUpperBound: number
): { p: number; pUpperBound: number; zLevel: number; zLevelLower: number } {
  const zLevelLower = normalUpperQuantile(pUpperBound);
  const p = defectives / units;
  // One literal with the bound in it: a spread into a second object ran at a few microseconds a window while
  // a first ranking's code was still cold.
  return { p, pUpperBound, zLevel: defectives === 0 ? zLevelLower : normalUpperQuantile(p), zLevelLower };
}

/**
 * defectivesFigures with the bound computed (one beta quantile, where the full analysis computes three for its
 * two-sided interval too). Throws RangeError as analyzeDefectives does.
 */
export function defectivesBounds(
  units: number,
  defectives: number,
  level: number
): { p: number; pUpperBound: number; zLevel: number; zLevelLower: number } {
  checkDefectives(units, defectives);
  return defectivesFigures(units, defectives, clopperPearsonUpperBound(defectives, units, level));
}

/**
 * Defects found on units with a number of opportunities each (Poisson): DPU = D/U, DPMO = 10⁶·D/(U·O),
 * first-pass yield = e^(−DPU) (the Poisson chance of a unit with no defect), z-level = Q⁻¹(DPMO/10⁶). Interval
 * from the exact Poisson limits on D. With no defect the z-level comes from the one-sided upper bound.
 */
export function analyzeDefects(
  units: number,
  defects: number,
  opportunitiesPerUnit = 1,
  options: CountOptions = {}
): CapabilityResult {
  checkDefects(units, defects, opportunitiesPerUnit);
  const level = options.confidence ?? 0.95;
  checkLevel(level);
  const opportunities = units * opportunitiesPerUnit;
  const ci = poissonCountInterval(defects, level);
  const { dpu, dpo, upperDpo, zLevel, zLevelLower } = defectsFigures(
    units,
    defects,
    opportunitiesPerUnit,
    ci.upperBound
  );
  const zero = defects === 0;
  const assumptions = [
    'counted data: defects occur independently, each opportunity equally likely to hold one (Poisson)',
    'first-pass yield e^(−DPU): the Poisson chance that a unit has no defect',
    `interval: exact Poisson limits on the defect count at ${Math.round(level * 1000) / 10} %`
  ];
  if (zero)
    assumptions.push(
      `no defect seen: the z-level shown is the lower bound, from the one-sided upper bound DPMO ≤ ${plainSignificant(upperDpo * 1e6, 3)}`
    );
  const result: CapabilityResult = {
    kind: 'defects',
    n: units,
    dpu,
    dpmo: dpo * 1e6,
    // For defect counts "ppm" is defects per million opportunities: the same figure as DPMO.
    ppm: dpo * 1e6,
    ppmTotal: dpo * 1e6,
    yield: Math.exp(-dpu),
    zLevel,
    model: 'poisson',
    modelLabel: 'Poisson count of defects',
    method: 'DPMO = 10⁶·defects/(units × opportunities); z-level = Q⁻¹(DPMO/10⁶)',
    assumptions,
    warnings: [],
    warningCodes: [],
    intervals: {
      dpu: { lower: ci.lower / units, upper: ci.upper / units, upperBound: ci.upperBound / units, level },
      dpmo: {
        lower: (ci.lower / opportunities) * 1e6,
        upper: Math.min(1, ci.upper / opportunities) * 1e6,
        upperBound: upperDpo * 1e6,
        level
      },
      yield: { lower: Math.exp(-ci.upper / units), upper: Math.exp(-ci.lower / units), level },
      zLevel: {
        lower: normalUpperQuantile(Math.min(1, ci.upper / opportunities)),
        upper: ci.lower === 0 ? Infinity : normalUpperQuantile(ci.lower / opportunities),
        lowerBound: zLevelLower,
        level
      }
    }
  };
  return shift(result, options);
}

/** The checks analyzeDefects makes of its counts; RangeError with what is wrong. */
function checkDefects(units: number, defects: number, opportunitiesPerUnit: number): void {
  if (!(Number.isInteger(units) && units >= 1))
    throw new RangeError(`Units inspected must be a whole number ≥ 1, got ${units}`);
  if (!(Number.isInteger(defects) && defects >= 0))
    throw new RangeError(`Defects must be a whole number ≥ 0, got ${defects}`);
  if (!(Number.isInteger(opportunitiesPerUnit) && opportunitiesPerUnit >= 1)) {
    throw new RangeError(`Opportunities per unit must be a whole number ≥ 1, got ${opportunitiesPerUnit}`);
  }
  const opportunities = units * opportunitiesPerUnit;
  if (defects > opportunities)
    throw new RangeError(
      `Defects (${defects}) cannot exceed the opportunities (${units} × ${opportunitiesPerUnit} = ${opportunities})`
    );
}

/**
 * The figures of a count of defects, given the one-sided upper bound of the count (poissonCountUpperBound): DPU,
 * defects per opportunity and its upper bound, the z-level (at the bound when none was seen) and its lower bound.
 * The one home of these rules, for the full analysis and for a portfolio's window figures.
 */
function defectsFigures(
  units: number,
  defects: number,
  opportunitiesPerUnit: number,
  countUpperBound: number
): { dpu: number; dpuUpper: number; dpo: number; upperDpo: number; zLevel: number; zLevelLower: number } {
  const opportunities = units * opportunitiesPerUnit;
  const dpo = defects / opportunities;
  const upperDpo = Math.min(1, countUpperBound / opportunities);
  const zLevelLower = normalUpperQuantile(upperDpo);
  // One literal with the bound on DPU in it (as defectivesFigures).
  return {
    dpu: defects / units,
    dpuUpper: countUpperBound / units,
    dpo,
    upperDpo,
    zLevel: defects === 0 ? zLevelLower : normalUpperQuantile(dpo),
    zLevelLower
  };
}

/**
 * defectsFigures with the bound computed (one chi-square quantile, where the full analysis computes three), and
 * the bound on DPU. Throws RangeError as analyzeDefects does.
 */
export function defectsBounds(
  units: number,
  defects: number,
  opportunitiesPerUnit: number,
  level: number
): ReturnType<typeof defectsFigures> {
  checkDefects(units, defects, opportunitiesPerUnit);
  return defectsFigures(units, defects, opportunitiesPerUnit, poissonCountUpperBound(defects, level));
}
