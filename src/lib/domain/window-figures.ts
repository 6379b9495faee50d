import { defectivesBounds, defectsBounds } from '../stats/analyze-counts';
import { checkSummary, summaryBounds, summaryIndexBounds } from '../stats/analyze-summary';
import type { CapabilityResult } from '../stats/capability-result';
import type { Characteristic } from './characteristic';
import { limitsFor } from './specification-history';
import type { StudyFields } from './study';
import { capabilityOfStudy } from './study-capability';

/**
 * What the ranking keeps of a window's capability result: the figures a row is judged on and shows, and the
 * one-sided bounds its status needs — not the labels, assumptions, warnings, every interval and the plot
 * points. A full result is built per window once (the figures come from the one analysis code); this is what
 * is cached, sent from the worker to the page and held for ten quarters of the review. At company size the full
 * results cost gigabytes and most of the page's receiving time; the details of one process are built when it
 * is opened (its process page).
 */
export interface WindowFigures {
  kind: CapabilityResult['kind'];
  n: number;
  mean?: number;
  sdOverall?: number;
  sdWithin?: number;
  cpk?: number;
  ppk?: number;
  /** Counted data: fraction defective, defects per unit, defects per million opportunities. */
  p?: number;
  dpu?: number;
  dpmo?: number;
  ppmTotal?: number;
  yield: number;
  zLevel: number;
  model: string;
  /** Whether the control chart showed no signal; absent where stability was not checked (summaries, counts). */
  stable?: boolean;
  /**
   * One-sided bounds at the result's confidence level. Fields of the figures themselves, not an object of their
   * own: every object kept per window is one more the garbage collector copies at company size.
   */
  cpkLower?: number;
  ppkLower?: number;
  zLevelLower?: number;
  /** Upper bound of the fraction out of specification (ppmTotal, else ppm, divided by 10⁶). */
  fractionUpper?: number;
  dpuUpper?: number;
}

/**
 * Every window's figures are one literal with every field (undefined where not known), whatever their kind: the
 * ranking reads them for every characteristic, and objects built field by field came in a dozen shapes, each read
 * slower for it, at company size a tenth of a first ranking.
 */
export function windowFiguresOf(r: CapabilityResult): WindowFigures {
  const iv = r.intervals;
  const fraction = (iv.ppmTotal ?? iv.ppm)?.upperBound;
  return {
    kind: r.kind,
    n: r.n,
    mean: r.mean,
    sdOverall: r.sdOverall,
    sdWithin: r.sdWithin,
    cpk: r.cpk,
    ppk: r.ppk,
    p: r.p,
    dpu: r.dpu,
    dpmo: r.dpmo,
    ppmTotal: r.ppmTotal,
    yield: r.yield,
    zLevel: r.zLevel,
    model: r.model,
    stable: r.stability ? r.stability.stable : undefined,
    cpkLower: iv.cpk?.lowerBound,
    ppkLower: iv.ppk?.lowerBound,
    zLevelLower: iv.zLevel?.lowerBound,
    fractionUpper: fraction !== undefined ? fraction / 1e6 : undefined,
    dpuUpper: iv.dpu?.upperBound
  };
}

/** The level of every bound the ranking judges on (the analyses' default). */
const LEVEL = 0.95;

/**
 * A window's figures. Merged summaries — most windows of a portfolio — take their figures and one-sided bounds
 * straight from `summaryBounds`, on which `analyzeSummary`'s computation is built, without the words, the
 * two-sided intervals and the objects a full result carries (a tenth of the time at company size); counts
 * likewise from `defectivesBounds` and `defectsBounds` (one quantile for the bound where the full analysis
 * computes three). Raw values go through the full analysis. Throws RangeError as `capabilityOfStudy` does.
 *
 * `bounds: 'index'` leaves a summary's fraction and z-level bounds out (summaryIndexBounds): what a status judged
 * against an index requirement needs, and never kept. Other kinds of data are complete either way.
 */
export function windowFiguresOfStudy(
  study: Pick<StudyFields, 'data' | 'period'>,
  characteristic: Pick<
    Characteristic,
    'lsl' | 'usl' | 'target' | 'limitChanges' | 'physicalMin' | 'physicalMax' | 'dataKind'
  >,
  sdWithin: number | undefined,
  bounds: 'all' | 'index' = 'all'
): WindowFigures {
  const d = study.data;
  if (d.kind === 'defectives') return defectivesWindowFigures(d.units, d.defectives);
  if (d.kind === 'defects') return defectsWindowFigures(d.units, d.defects, d.opportunitiesPerUnit);
  if (d.kind !== 'summary' || !(d.sd > 0))
    return windowFiguresOf(
      capabilityOfStudy(study, characteristic, sdWithin !== undefined ? { sdWithin } : {})
    );
  const spec = limitsFor(characteristic, study.period);
  checkSummary(d.n, d.mean, d.sd, spec);
  const b = (bounds === 'all' ? summaryBounds : summaryIndexBounds)(d.n, d.mean, d.sd, spec, LEVEL, sdWithin);
  // One literal with every field, as windowFiguresOf.
  return {
    kind: 'summary',
    n: d.n,
    mean: d.mean,
    sdOverall: d.sd,
    sdWithin: b.within?.sd,
    cpk: b.within?.indices.k,
    ppk: b.overall.k,
    p: undefined,
    dpu: undefined,
    dpmo: undefined,
    ppmTotal: b.tails.total * 1e6,
    yield: 1 - b.tails.total,
    zLevel: b.tails.zLevel,
    model: 'normal',
    stable: undefined,
    cpkLower: b.within?.cpkLower,
    ppkLower: b.ppkLower,
    zLevelLower: b.zLevelLower,
    // Through ppm and back, as windowFiguresOf does with a full result: the same number to the last bit.
    fractionUpper: b.fractionUpper !== undefined ? (b.fractionUpper * 1e6) / 1e6 : undefined,
    dpuUpper: undefined
  };
}

/** A count of defectives's window figures, as windowFiguresOf gives them from analyzeDefectives. */
function defectivesWindowFigures(units: number, defectives: number): WindowFigures {
  const b = defectivesBounds(units, defectives, LEVEL);
  return countWindowFigures({
    kind: 'defectives',
    n: units,
    p: b.p,
    dpu: undefined,
    dpmo: undefined,
    ppmTotal: b.p * 1e6,
    yield: 1 - b.p,
    zLevel: b.zLevel,
    model: 'binomial',
    zLevelLower: b.zLevelLower,
    // Through ppm and back, as windowFiguresOf does with the full result's ppm interval.
    fractionUpper: (b.pUpperBound * 1e6) / 1e6,
    dpuUpper: undefined
  });
}

/** A count of defects's window figures, as windowFiguresOf gives them from analyzeDefects. */
function defectsWindowFigures(units: number, defects: number, opportunitiesPerUnit: number): WindowFigures {
  const b = defectsBounds(units, defects, opportunitiesPerUnit, LEVEL);
  const dpmo = b.dpo * 1e6;
  return countWindowFigures({
    kind: 'defects',
    n: units,
    p: undefined,
    dpu: b.dpu,
    dpmo,
    ppmTotal: dpmo,
    yield: Math.exp(-b.dpu),
    zLevel: b.zLevel,
    model: 'poisson',
    zLevelLower: b.zLevelLower,
    // The full result has no interval on the fraction out of specification for defects: the bound is on DPU.
    fractionUpper: undefined,
    dpuUpper: b.dpuUpper
  });
}

type CountFigures = Pick<
  WindowFigures,
  | 'kind'
  | 'n'
  | 'p'
  | 'dpu'
  | 'dpmo'
  | 'ppmTotal'
  | 'yield'
  | 'zLevel'
  | 'model'
  | 'zLevelLower'
  | 'fractionUpper'
  | 'dpuUpper'
>;

/** A count's figures as one literal with every field (as windowFiguresOf), those of measured data absent. */
function countWindowFigures(c: CountFigures): WindowFigures {
  return {
    kind: c.kind,
    n: c.n,
    mean: undefined,
    sdOverall: undefined,
    sdWithin: undefined,
    cpk: undefined,
    ppk: undefined,
    p: c.p,
    dpu: c.dpu,
    dpmo: c.dpmo,
    ppmTotal: c.ppmTotal,
    yield: c.yield,
    zLevel: c.zLevel,
    model: c.model,
    stable: undefined,
    cpkLower: undefined,
    ppkLower: undefined,
    zLevelLower: c.zLevelLower,
    fractionUpper: c.fractionUpper,
    dpuUpper: c.dpuUpper
  };
}
