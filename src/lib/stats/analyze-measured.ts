import { andersonDarlingNormal } from './anderson-darling';
import { cpm as cpmIndex, indices } from './capability-indices';
import type { CapabilityResult, FigureInterval } from './capability-result';
import { bissellInterval, clopperPearson, cpmInterval, spreadIndexInterval } from './confidence-bounds';
import { mean as meanOf, sampleVariance } from './moments';
import type { FittedModel, ModelName } from './models/fitted-model';
import { fitModel, isRefusal, searchModels } from './model-search';
import { normalQuantile, normalUpperQuantile } from './normal-distribution';
import { percentileIndices } from './percentile-method';
import { quantileType6, sortedCopy } from './quantiles';
import {
  consecutiveSubgroups,
  defaultEstimator,
  groupBySubgroup,
  SIGMA_ESTIMATOR_LABELS,
  withinSigma,
  type SigmaEstimator
} from './sigma-estimators';
import { WarningList } from './result-warnings';
import { SIGMA_SHIFT } from './sigma-level';
import { checkSpecification, type Specification } from './specification';
import { individualsStability, subgroupStability, type StabilityResult } from './stability';
import { fractionIntervals } from './fraction-bounds';
import { modelTailFractions, normalTailFractions, type TailFractions } from './tail-fractions';
import { plainPValue, plainSignificant } from './plain-number';

export type ModelChoice = 'auto' | 'quantile' | ModelName;

export interface MeasuredOptions {
  spec: Specification;
  /** Subgroup id of each value (same length), or a fixed size for consecutive subgroups. */
  subgroups?: readonly string[];
  subgroupSize?: number;
  estimator?: SigmaEstimator;
  model?: ModelChoice;
  /** Confidence level for intervals and bounds; default 0.95. */
  confidence?: number;
  /** Physical bounds the characteristic declares (a length cannot be negative). */
  physicalMin?: number;
  physicalMax?: number;
  /** Also report the short-term sigma level zLevel + shift (the 1.5σ convention); off unless asked. */
  shortTermShift?: number;
  /** Threshold for the ruling index (Cpk, or Ppk when no within sigma exists) to answer "shown capable?". */
  requiredIndex?: number;
}

const SMALL_SAMPLE = 30;

function ppm(fraction: number | undefined): number | undefined {
  return fraction === undefined ? undefined : fraction * 1e6;
}

/** The tail figures every model reports, in the result's key names. */
function tailFigures(tails: TailFractions) {
  return {
    ppmBelow: ppm(tails.below),
    ppmAbove: ppm(tails.above),
    ppmTotal: tails.total * 1e6,
    yield: 1 - tails.total,
    zLevel: tails.zLevel,
    zMin: tails.zMin,
    zLower: tails.zLower,
    zUpper: tails.zUpper
  };
}

function defined<T extends object>(o: T): T {
  for (const k of Object.keys(o) as (keyof T)[]) if (o[k] === undefined) delete o[k];
  return o;
}

/** Blom (1958) normal scores against sorted values, thinned evenly to at most `max` points. */
export function probabilityPlot(sorted: Float64Array, max = 400): { value: number[]; normalScore: number[] } {
  const n = sorted.length;
  const step = Math.max(1, Math.ceil(n / max));
  const value: number[] = [];
  const normalScore: number[] = [];
  for (let i = 0; i < n; i += step) {
    value.push(sorted[i] as number);
    normalScore.push(normalQuantile((i + 1 - 0.375) / (n + 0.25)));
  }
  if ((n - 1) % step !== 0) {
    value.push(sorted[n - 1] as number);
    normalScore.push(normalQuantile((n - 0.375) / (n + 0.25)));
  }
  return { value, normalScore };
}

/**
 * Capability of one study of measured values: every figure of the normal model (or of the model the data call
 * for), with intervals, normality, stability and plain-language assumptions and warnings. Throws RangeError on
 * unusable input (fewer than 2 values, a value that is not finite, LSL ≥ USL).
 */
export function analyzeMeasured(values: ArrayLike<number>, options: MeasuredOptions): CapabilityResult {
  const spec = options.spec;
  checkSpecification(spec);
  const n = values.length;
  if (n < 2) throw new RangeError(`At least 2 values are needed for capability figures (got ${n})`);
  for (let i = 0; i < n; i += 1) {
    if (!Number.isFinite(values[i] as number)) throw new RangeError(`Value ${i + 1} is not a finite number`);
  }
  const level = options.confidence ?? 0.95;
  if (!(level > 0 && level < 1))
    throw new RangeError(`A confidence level strictly between 0 and 1 is needed (got ${level})`);

  const assumptions: string[] = [];
  const warnings = new WarningList();
  const intervals: Record<string, FigureInterval> = {};
  const sorted = sortedCopy(values);
  const mu = meanOf(values);
  const sdOverall = Math.sqrt(sampleVariance(values, mu));

  let outside = 0;
  for (let i = 0; i < n; i += 1) {
    const v = values[i] as number;
    if ((spec.lsl !== undefined && v < spec.lsl) || (spec.usl !== undefined && v > spec.usl)) outside += 1;
  }
  const ppmObserved = (outside / n) * 1e6;

  if (options.physicalMin !== undefined && (sorted[0] as number) < options.physicalMin) {
    warnings.add(
      'below-physical-minimum',
      `Some values lie below the physical minimum of ${options.physicalMin} declared for this characteristic: check the data`
    );
  }
  if (options.physicalMax !== undefined && (sorted[n - 1] as number) > options.physicalMax) {
    warnings.add(
      'above-physical-maximum',
      `Some values lie above the physical maximum of ${options.physicalMax} declared for this characteristic: check the data`
    );
  }
  let distinct = 1;
  for (let i = 1; i < n; i += 1) if (sorted[i] !== sorted[i - 1]) distinct += 1;

  // Zero spread: no index, no model, only what was observed. A model asked for by name cannot be fitted to
  // identical values; answering with the observed fraction instead would pass off another method as that model.
  const requestedModel = options.model ?? 'auto';
  if (!(sdOverall > 0) && requestedModel !== 'auto' && requestedModel !== 'quantile') {
    throw new RangeError(
      `The ${requestedModel} model cannot be used: all ${n} values are identical, so there is no spread to fit; choose the automatic model to report the observed fraction out of specification`
    );
  }
  if (!(sdOverall > 0)) {
    warnings.add(
      'no-spread',
      'All values are identical: the spread is zero, so no capability index or model tail can be computed'
    );
    const ci = clopperPearson(outside, n, level);
    intervals.ppmObserved = {
      lower: ci.lower * 1e6,
      upper: ci.upper * 1e6,
      upperBound: ci.upperBound * 1e6,
      level
    };
    const total = Math.max(outside / n, ci.upperBound);
    return {
      kind: 'measured',
      n,
      mean: mu,
      sdOverall,
      ppmTotal: ppmObserved,
      ppmObserved,
      yield: 1 - outside / n,
      zLevel: normalUpperQuantile(Math.min(1, total)),
      model: 'observed',
      modelLabel: 'observed fraction (no spread)',
      method: 'observed fraction out of specification; z-level from its upper confidence bound',
      assumptions: ['z-level from the upper confidence bound of the observed fraction (Clopper–Pearson)'],
      warnings: warnings.texts,
      warningCodes: warnings.codes,
      intervals
    };
  }

  // Within sigma.
  let groups: number[][] | undefined;
  if (options.subgroups) {
    if (options.subgroups.length !== n)
      throw new RangeError(`${options.subgroups.length} subgroup ids for ${n} values`);
    groups = groupBySubgroup(values, options.subgroups);
  } else if (options.subgroupSize !== undefined) {
    if (!(Number.isInteger(options.subgroupSize) && options.subgroupSize >= 2)) {
      throw new RangeError(`Subgroup size must be a whole number of at least 2, got ${options.subgroupSize}`);
    }
    groups = consecutiveSubgroups(values, options.subgroupSize);
    if (groups.length * options.subgroupSize < n) {
      warnings.add(
        'incomplete-subgroup',
        `The last ${n - groups.length * options.subgroupSize} values do not fill a subgroup of ${options.subgroupSize} and are left out of the within sigma`
      );
    }
  }
  const estimator = options.estimator ?? defaultEstimator(groups);
  let sdWithin: number | undefined;
  try {
    sdWithin = withinSigma(estimator, values, groups);
  } catch (error) {
    throw new RangeError((error as Error).message, { cause: error });
  }
  if (!(sdWithin > 0)) {
    warnings.add(
      'no-within-spread',
      'The within-subgroup spread is zero (repeated identical readings): Cp and Cpk are not computed'
    );
    sdWithin = undefined;
  } else {
    assumptions.push(SIGMA_ESTIMATOR_LABELS[estimator]);
  }
  assumptions.push('overall sigma: sample standard deviation of all values (n − 1)');

  // Normality and stability.
  const normality = n >= 3 ? andersonDarlingNormal(sorted, mu, sdOverall) : undefined;
  if (n < 8)
    warnings.add(
      'few-values-for-normality',
      `Only ${n} values: the normality test has little power and its p-value is rough`
    );
  let stability: StabilityResult | undefined;
  try {
    stability =
      groups && groups.filter((g) => g.length >= 2).length >= 3 && sdWithin
        ? subgroupStability(groups, sdWithin)
        : n >= 3
          ? individualsStability(values, mu)
          : undefined;
  } catch {
    stability = undefined;
  }
  if (stability && !stability.stable) {
    warnings.add(
      'not-shown-stable',
      `Not shown to be stable — capability may not predict future output (${stability.description})`
    );
  }

  // Model choice.
  const requested = requestedModel;
  let model: FittedModel | undefined;
  let modelName: string;
  let candidates: CapabilityResult['models'];
  if (requested === 'normal') {
    modelName = 'normal';
  } else if (requested === 'quantile') {
    modelName = 'quantile';
  } else if (requested === 'auto') {
    if (normality && normality.p >= 0.05) {
      modelName = 'normal';
    } else {
      const search = searchModels(sorted, mu, sdOverall);
      candidates = search.candidates;
      model = search.best;
      modelName = model ? model.name : 'observed';
      if (model?.name !== 'normal' && normality) {
        assumptions.push(
          `normality rejected (Anderson–Darling p ${plainPValue(normality.p).startsWith('<') ? '' : '= '}${plainPValue(normality.p)}); models compared by A²`
        );
      }
    }
  } else {
    const f = fitModel(requested, sorted, mu, sdOverall);
    if (isRefusal(f)) throw new RangeError(`The ${requested} model cannot be fitted: ${f.reason}`);
    model = f;
    modelName = f.name;
    const search = searchModels(sorted, mu, sdOverall, [requested]);
    candidates = search.candidates;
    if (!candidates[0]?.accepted)
      warnings.add(
        'requested-model-fits-poorly',
        `The requested ${requested} model does not fit these data well (${candidates[0]?.note ?? ''})`
      );
  }
  if (model?.name === 'normal') {
    modelName = 'normal';
    model = undefined;
  }

  const within = sdWithin !== undefined ? indices(mu, sdWithin, spec) : {};
  const withinTails = sdWithin !== undefined ? normalTailFractions(mu, sdWithin, spec) : undefined;
  const result: CapabilityResult = {
    kind: 'measured',
    n,
    mean: mu,
    sdOverall,
    yield: 0,
    zLevel: 0,
    model: modelName,
    modelLabel: '',
    method: '',
    assumptions,
    warnings: warnings.texts,
    warningCodes: warnings.codes,
    intervals,
    ppmObserved,
    probabilityPlot: probabilityPlot(sorted),
    ...(sdWithin !== undefined ? { sdWithin, sigmaEstimator: estimator } : {}),
    ...(normality ? { normality } : {}),
    ...(stability ? { stability } : {}),
    ...(candidates ? { models: candidates } : {})
  };

  if (modelName === 'normal') {
    const overall = indices(mu, sdOverall, spec);
    const tails = normalTailFractions(mu, sdOverall, spec);
    Object.assign(
      result,
      defined({
        cp: within.spread,
        cpl: within.lower,
        cpu: within.upper,
        cpk: within.k,
        pp: overall.spread,
        ppl: overall.lower,
        ppu: overall.upper,
        ppk: overall.k,
        cpm: cpmIndex(mu, sdOverall, spec),
        ...tailFigures(tails),
        ppmTotalWithin: withinTails ? withinTails.total * 1e6 : undefined,
        zLevelWithin: withinTails?.zLevel,
        zMinWithin: withinTails?.zMin
      })
    );
    result.modelParameters = { mean: mu, sd: sdOverall };
    result.modelLabel = `normal (mean ${plainSignificant(mu, 6)}, overall sd ${plainSignificant(sdOverall, 4)})`;
    result.method = `normal model; ${sdWithin !== undefined ? SIGMA_ESTIMATOR_LABELS[estimator] : 'no within sigma'}; overall sigma for Pp/Ppk, ppm, yield and z-level`;
    assumptions.unshift('normal model');
    if (normality && normality.p < 0.05)
      warnings.add(
        'normality-rejected',
        `Normality is rejected (Anderson–Darling p ${plainPValue(normality.p).startsWith('<') ? '' : '= '}${plainPValue(normality.p)}): the normal-model ppm may be far off in the tails`
      );
    addNormalIntervals(result, n, level, spec.target);
  } else if (model) {
    const tails = modelTailFractions(model.cdf, model.sf, spec);
    const pct = percentileIndices(model.quantile, spec);
    Object.assign(
      result,
      defined({
        ...pct,
        ...tailFigures(tails)
      })
    );
    if ((model.parameters.massAtZero ?? 0) > 1e-9) {
      warnings.add(
        'model-mass-below-zero',
        `The Box-Cox model puts ${plainSignificant(model.parameters.massAtZero! * 100, 2)} % of its mass at or below zero, where no value can lie: its lower tail is unreliable`
      );
    }
    result.modelLabel = model.label;
    result.modelParameters = { ...model.parameters };
    result.method = `${model.label}; ppm from the model's tails; Pp/Ppk by the percentile method of ISO 22514-2`;
    assumptions.unshift(`non-normal model: ${model.label}`);
    assumptions.push(
      'Pp/Ppk from the model quantiles X0.00135, X0.5, X0.99865 (ISO 22514-2 percentile method)'
    );
    assumptions.push('z-values are normal equivalents of the model tail fractions');
    assumptions.push('Cp/Cpk are not reported: within-sigma indices assume a normal model');
    warnings.add(
      'no-model-interval',
      'No confidence interval is given for model-based figures; judge them with the sample size in mind'
    );
  } else {
    // Empirical: the percentile method on the data themselves, ppm as observed with an exact interval.
    const pct = percentileIndices((p) => quantileType6(sorted, p), spec);
    const ci = clopperPearson(outside, n, level);
    const upper = ci.upperBound;
    Object.assign(
      result,
      defined({
        ...pct,
        ppmTotal: ppmObserved,
        yield: 1 - outside / n,
        zLevel: outside === 0 ? normalUpperQuantile(upper) : normalUpperQuantile(outside / n)
      })
    );
    intervals.ppmTotal = { lower: ci.lower * 1e6, upper: ci.upper * 1e6, upperBound: upper * 1e6, level };
    intervals.zLevel = {
      lower: normalUpperQuantile(ci.upper),
      upper: outside === 0 ? Infinity : normalUpperQuantile(ci.lower),
      lowerBound: normalUpperQuantile(upper),
      level
    };
    result.modelLabel =
      requested === 'quantile' ? 'empirical quantiles (no model)' : 'observed fraction (no model fits)';
    result.method =
      'observed fraction out of specification with a Clopper–Pearson interval; Pp/Ppk by the ISO 22514-2 percentile method on sample quantiles (p(n+1) rule)';
    assumptions.unshift(
      requested === 'quantile'
        ? 'no distribution model: sample quantiles'
        : 'no candidate model fits: observed fraction used'
    );
    if (outside === 0)
      assumptions.push('no value outside the limits: the z-level is the lower confidence bound');
    if (requested !== 'quantile')
      warnings.add(
        'no-model-fits',
        'None of the candidate models fits these data: ppm is the observed fraction, with a wide interval'
      );
    if (n < 1000)
      warnings.add(
        'rough-percentiles',
        `Sample quantiles X0.00135 and X0.99865 need far more than ${n} values to be estimated; these Pp/Ppk are rough`
      );
  }

  if (n < SMALL_SAMPLE) {
    const width = result.intervals.ppk ?? result.intervals.cpk;
    const spread =
      width && result.ppk
        ? ` (the ${Math.round(level * 100)} % interval for ${result.intervals.ppk ? 'Ppk' : 'Cpk'} runs from ${width.lower.toFixed(2)} to ${width.upper.toFixed(2)})`
        : '';
    warnings.add('small-sample', `Only ${n} values: intervals are wide${spread}; 30 or more are advised`);
  }
  if (distinct < Math.min(10, n)) {
    warnings.add(
      'coarse-resolution',
      `Only ${distinct} distinct values: the measurement resolution may be too coarse for these limits`
    );
  }
  if (options.shortTermShift !== undefined) {
    result.zLevelShortTerm = result.zLevel + options.shortTermShift;
    assumptions.push(
      `short-term sigma level = z-level + ${options.shortTermShift} (the ${SIGMA_SHIFT}σ shift convention), reported because it was asked for`
    );
  }
  if (options.requiredIndex !== undefined) addRequirement(result, options.requiredIndex, level);
  return result;
}

function addNormalIntervals(
  result: CapabilityResult,
  n: number,
  level: number,
  target: number | undefined
): void {
  const iv = result.intervals;
  const pp = result.pp !== undefined ? spreadIndexInterval(result.pp, n, level) : undefined;
  if (result.cp !== undefined) iv.cp = spreadIndexInterval(result.cp, n, level);
  if (pp) iv.pp = pp;
  if (
    result.cpm !== undefined &&
    target !== undefined &&
    result.mean !== undefined &&
    result.sdOverall !== undefined
  )
    iv.cpm = cpmInterval(result.cpm, n, result.mean, result.sdOverall, target, level);
  if (result.cpk !== undefined && result.cpk > 0) iv.cpk = bissellInterval(result.cpk, n, level);
  if (result.ppk !== undefined && result.ppk > 0) {
    const ppk = bissellInterval(result.ppk, n, level);
    iv.ppk = ppk;
    Object.assign(iv, fractionIntervals(ppk, pp));
  }
  result.assumptions.push(
    'intervals: chi-square with n − 1 degrees of freedom for Cp and Pp, with Boyles (1991) degrees of freedom for Cpm, Bissell (1990) for Cpk and Ppk; z-level and ppm intervals follow from those of Pp and Ppk (approximate)'
  );
}

function addRequirement(result: CapabilityResult, threshold: number, level: number): void {
  const index: 'cpk' | 'ppk' = result.cpk !== undefined && result.intervals.cpk ? 'cpk' : 'ppk';
  const estimate = result[index];
  const bound = result.intervals[index]?.lowerBound;
  if (estimate === undefined || bound === undefined) {
    result.warnings.push(
      `Whether ${index === 'cpk' ? 'Cpk' : 'Ppk'} ≥ ${threshold} cannot be shown: no interval exists for this model`
    );
    result.warningCodes.push('requirement-not-testable');
    return;
  }
  result.requirement = { index, threshold, level, estimate, lowerBound: bound, shown: bound >= threshold };
}
