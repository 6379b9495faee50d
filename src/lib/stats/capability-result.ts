import type { WarningCode } from './result-warnings';
import type { NormalityTest } from './anderson-darling';
import type { SigmaEstimator } from './sigma-estimators';
import type { StabilityResult } from './stability';

/** An interval on one figure. `lowerBound`/`upperBound` are one-sided bounds at the same level. */
export interface FigureInterval {
  lower: number;
  upper: number;
  level: number;
  lowerBound?: number;
  upperBound?: number;
}

/** A candidate model in the non-normal search, with its fit quality. */
export interface ModelCandidate {
  model: string;
  label: string;
  /** Anderson–Darling A² of the fitted CDF (lower is better). */
  ad?: number;
  /** p-value where one is tabled for that case (normal, and the normal test of log/Box-Cox/Johnson-transformed data). */
  p?: number;
  accepted: boolean;
  note: string;
}

/**
 * Every figure of one study with the method and assumptions behind it. Keys follow the command line's JSON;
 * a figure that does not exist for the data (Cp without two limits, Cpk without a within sigma) is absent.
 */
export interface CapabilityResult {
  kind: 'measured' | 'summary' | 'defectives' | 'defects';
  n: number;
  mean?: number;
  sdOverall?: number;
  sdWithin?: number;
  sigmaEstimator?: SigmaEstimator;
  cp?: number;
  cpl?: number;
  cpu?: number;
  cpk?: number;
  pp?: number;
  ppl?: number;
  ppu?: number;
  ppk?: number;
  cpm?: number;
  /** Counted data: fraction defective, defects per unit, defects per million opportunities. */
  p?: number;
  dpu?: number;
  dpmo?: number;
  ppm?: number;
  ppmBelow?: number;
  ppmAbove?: number;
  ppmTotal?: number;
  ppmObserved?: number;
  ppmTotalWithin?: number;
  /** Fraction within specification (first-pass yield for defect counts). */
  yield: number;
  zLevel: number;
  zMin?: number;
  zLower?: number;
  zUpper?: number;
  zLevelWithin?: number;
  zMinWithin?: number;
  /** zLevel + shift, only when short-term reporting with the 1.5σ convention was asked for. */
  zLevelShortTerm?: number;
  model: string;
  modelLabel: string;
  /** The chosen model's parameters (a fitted model is rebuilt from them by `modelFromParameters`, never refitted). */
  modelParameters?: Record<string, number>;
  method: string;
  assumptions: string[];
  warnings: string[];
  /** The code of each warning, in the same order: what code reads (flags, badges); the sentences are for people. */
  warningCodes: WarningCode[];
  intervals: Record<string, FigureInterval>;
  normality?: NormalityTest;
  stability?: StabilityResult;
  models?: ModelCandidate[];
  /** Sorted values against normal scores (Blom), thinned to at most 400 points, for a probability plot. */
  probabilityPlot?: { value: number[]; normalScore: number[] };
  /** The answer to "is the ruling index at least T with the stated confidence?" when a threshold was given. */
  requirement?: {
    index: 'cpk' | 'ppk';
    threshold: number;
    level: number;
    estimate: number;
    lowerBound: number;
    shown: boolean;
  };
}
