import jStat from 'jstat';
import { boundedMemo } from './bounded-memo';
import { gammaQuantile } from './incomplete-gamma';
import { normalQuantile } from './normal-distribution';

/**
 * Chi-square quantile χ²_{p, df} = 2·Γ⁻¹(p; df/2): our incomplete gamma, which stays fast for the large df of big
 * studies. Remembered (bounded-memo.ts): a portfolio asks for the same sample sizes again and again.
 */
export const chiSquareQuantile: (p: number, df: number) => number = boundedMemo(
  (p: number, df: number) => 2 * gammaQuantile(p, df / 2, 1)
);

/** The beta quantile B⁻¹(p; a, b) of jStat, remembered as above (Clopper–Pearson bounds of counted data). */
const betaQuantile = boundedMemo((p: number, a: number, b: number) => jStat.beta.inv(p, a, b));

/** A two-sided interval and the one-sided lower bound at the same confidence level. */
export interface IndexInterval {
  lower: number;
  upper: number;
  /** One-sided lower confidence bound at `level` (what "Cpk ≥ 1.33 with 95 % confidence" asks about). */
  lowerBound: number;
  level: number;
}

function checkLevel(level: number): void {
  if (!(level > 0 && level < 1))
    throw new RangeError(`A confidence level strictly between 0 and 1 is needed (got ${level})`);
}

/**
 * Interval for Cp or Pp from the chi-square distribution of (n−1)s²/σ² (Montgomery, Introduction to Statistical
 * Quality Control, 6th ed., eq. 8.19; NIST/SEMATECH e-Handbook §6.1.6):
 *   Cp·√(χ²_{α/2, n−1}/(n−1)) ≤ Cp ≤ Cp·√(χ²_{1−α/2, n−1}/(n−1)); lower bound with χ²_{α, n−1}.
 * Reproduces the e-Handbook's furnace case study interval (1.17234, 1.45372).
 */
export function spreadIndexInterval(index: number, n: number, level = 0.95): IndexInterval {
  return chiSquareIndexInterval(index, n - 1, level);
}

/** The one-sided lower bound of spreadIndexInterval alone (the portfolio judges on it; the same number). */
export function spreadIndexLowerBound(index: number, n: number, level = 0.95): number {
  checkLevel(level);
  return index * chiSquareFactor(1 - level, n - 1);
}

/** √(χ²_{p, ν}/ν): the factor of a chi-square bound on a spread index. */
function chiSquareFactor(p: number, df: number): number {
  return Math.sqrt(chiSquareQuantile(p, df) / df);
}

/** index·√(χ²_{p, ν}/ν) at p = α/2, 1 − α/2 and α: the chi-square interval of a spread index with ν degrees of freedom. */
function chiSquareIndexInterval(index: number, df: number, level: number): IndexInterval {
  checkLevel(level);
  const alpha = 1 - level;
  return {
    lower: index * chiSquareFactor(alpha / 2, df),
    upper: index * chiSquareFactor(1 - alpha / 2, df),
    lowerBound: index * chiSquareFactor(alpha, df),
    level
  };
}

/**
 * Interval for Cpm after Boyles (1991, "The Taguchi capability index", Journal of Quality Technology 23(1)):
 * Ĉpm·√(χ²_{α/2, ν}/ν) ≤ Cpm ≤ Ĉpm·√(χ²_{1−α/2, ν}/ν), with the degrees of freedom
 *   ν = n·(1 + a²)² / (1 + 2a²),   a = (x̄ − T)/s,
 * which account for the mean's distance from target (ν = n when on target, larger when off it; the
 * n − 1 of the Cp interval ignores that the off-target part is estimated too). The formula is as restated in
 * Montgomery, Introduction to Statistical Quality Control (6th ed., §8.3.5), quoted from memory; its coverage is
 * checked by simulation in the tests.
 */
export function cpmInterval(
  index: number,
  n: number,
  mean: number,
  sd: number,
  target: number,
  level = 0.95
): IndexInterval {
  const a2 = sd > 0 ? ((mean - target) / sd) ** 2 : 0;
  return chiSquareIndexInterval(index, (n * (1 + a2) ** 2) / (1 + 2 * a2), level);
}

/**
 * Bissell's (1990) normal approximation for Cpk or Ppk ("How reliable is your capability index?", Applied
 * Statistics 39(3)): Ĉpk·(1 ∓ z·√(1/(9n·Ĉpk²) + 1/(2(n−1)))), z the two-sided quantile; the lower bound uses the
 * one-sided quantile. Reproduces the e-Handbook furnace interval (1.12771, 1.41882).
 */
export function bissellInterval(index: number, n: number, level = 0.95): IndexInterval {
  checkLevel(level);
  const se = bissellSe(index, n);
  const zTwo = levelQuantile(1 - (1 - level) / 2);
  return {
    lower: index * (1 - zTwo * se),
    upper: index * (1 + zTwo * se),
    lowerBound: bissellLowerBound(index, n, level),
    level
  };
}

/** The one-sided lower bound of bissellInterval alone (the portfolio judges on it; the same number). */
export function bissellLowerBound(index: number, n: number, level = 0.95): number {
  checkLevel(level);
  return index * (1 - levelQuantile(level) * bissellSe(index, n));
}

function bissellSe(index: number, n: number): number {
  return Math.sqrt(1 / (9 * n * index * index) + 1 / (2 * (n - 1)));
}

/** Φ⁻¹ of a confidence level, remembered: the same two or three levels are asked for every window. */
const levelQuantile = boundedMemo((p: number) => normalQuantile(p));

/** Two-sided and one-sided bounds on a proportion, and on a Poisson rate. */
export interface ProportionInterval {
  lower: number;
  upper: number;
  /** One-sided upper bound at `level` (the useful bound when few or no defects were seen). */
  upperBound: number;
  level: number;
}

/**
 * Clopper–Pearson exact interval for x successes in n trials (Clopper & Pearson 1934, Biometrika 26):
 * lower = B⁻¹(α/2; x, n−x+1), upper = B⁻¹(1−α/2; x+1, n−x); x = 0 gives lower 0, x = n gives upper 1.
 * One-sided upper bound = B⁻¹(level; x+1, n−x), which for x = 0 is 1 − α^(1/n) (≈ 3/n at 95 %, the rule of three).
 */
export function clopperPearson(x: number, n: number, level = 0.95): ProportionInterval {
  checkLevel(level);
  const alpha = 1 - level;
  const lower = x === 0 ? 0 : betaQuantile(alpha / 2, x, n - x + 1);
  const upper = x === n ? 1 : betaQuantile(1 - alpha / 2, x + 1, n - x);
  return { lower, upper, upperBound: clopperPearsonUpperBound(x, n, level), level };
}

/**
 * The one-sided upper bound of clopperPearson alone (one beta quantile, not three): what a portfolio judges a
 * count of defectives on.
 */
export function clopperPearsonUpperBound(x: number, n: number, level = 0.95): number {
  checkLevel(level);
  return x === n ? 1 : x === 0 ? 1 - (1 - level) ** (1 / n) : betaQuantile(level, x + 1, n - x);
}

/**
 * Exact Poisson interval for a count x via the chi-square relation (Garwood 1936; Ulm 1990):
 * lower = χ²_{α/2, 2x}/2, upper = χ²_{1−α/2, 2x+2}/2; one-sided upper = χ²_{level, 2x+2}/2 (x = 0: −ln α).
 * Returns bounds on the count; divide by the exposure for a rate.
 */
export function poissonCountInterval(x: number, level = 0.95): ProportionInterval {
  checkLevel(level);
  const alpha = 1 - level;
  const lower = x === 0 ? 0 : chiSquareQuantile(alpha / 2, 2 * x) / 2;
  const upper = chiSquareQuantile(1 - alpha / 2, 2 * x + 2) / 2;
  return { lower, upper, upperBound: poissonCountUpperBound(x, level), level };
}

/** The one-sided upper bound of poissonCountInterval alone (one chi-square quantile, not three). */
export function poissonCountUpperBound(x: number, level = 0.95): number {
  checkLevel(level);
  return x === 0 ? -Math.log(1 - level) : chiSquareQuantile(level, 2 * x + 2) / 2;
}
