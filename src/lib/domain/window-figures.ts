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
  /** One-sided bounds at the result's confidence level. */
  bounds: {
    cpkLower?: number;
    ppkLower?: number;
    zLevelLower?: number;
    /** Upper bound of the fraction out of specification (ppmTotal, else ppm, divided by 10⁶). */
    fractionUpper?: number;
    dpuUpper?: number;
  };
}

export function windowFiguresOf(r: CapabilityResult): WindowFigures {
  const out: WindowFigures = {
    kind: r.kind,
    n: r.n,
    yield: r.yield,
    zLevel: r.zLevel,
    model: r.model,
    bounds: {}
  };
  if (r.mean !== undefined) out.mean = r.mean;
  if (r.sdOverall !== undefined) out.sdOverall = r.sdOverall;
  if (r.sdWithin !== undefined) out.sdWithin = r.sdWithin;
  if (r.cpk !== undefined) out.cpk = r.cpk;
  if (r.ppk !== undefined) out.ppk = r.ppk;
  if (r.p !== undefined) out.p = r.p;
  if (r.dpu !== undefined) out.dpu = r.dpu;
  if (r.dpmo !== undefined) out.dpmo = r.dpmo;
  if (r.ppmTotal !== undefined) out.ppmTotal = r.ppmTotal;
  if (r.stability) out.stable = r.stability.stable;
  const iv = r.intervals;
  const fraction = (iv.ppmTotal ?? iv.ppm)?.upperBound;
  if (iv.cpk?.lowerBound !== undefined) out.bounds.cpkLower = iv.cpk.lowerBound;
  if (iv.ppk?.lowerBound !== undefined) out.bounds.ppkLower = iv.ppk.lowerBound;
  if (iv.zLevel?.lowerBound !== undefined) out.bounds.zLevelLower = iv.zLevel.lowerBound;
  if (fraction !== undefined) out.bounds.fractionUpper = fraction / 1e6;
  if (iv.dpu?.upperBound !== undefined) out.bounds.dpuUpper = iv.dpu.upperBound;
  return out;
}

/** The level of every bound the ranking judges on (the analyses' default). */
const LEVEL = 0.95;

/**
 * A window's figures. Merged summaries — most windows of a portfolio — take their figures and one-sided bounds
 * straight from `summaryBounds`, on which `analyzeSummary`'s computation is built, without the words, the
 * two-sided intervals and the objects a full result carries (a tenth of the time at company size).
 * Raw values and counts go through the full analysis. Throws RangeError as `capabilityOfStudy` does.
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
  if (d.kind !== 'summary' || !(d.sd > 0))
    return windowFiguresOf(
      capabilityOfStudy(study, characteristic, sdWithin !== undefined ? { sdWithin } : {})
    );
  const spec = limitsFor(characteristic, study.period);
  checkSummary(d.n, d.mean, d.sd, spec);
  const b = (bounds === 'all' ? summaryBounds : summaryIndexBounds)(d.n, d.mean, d.sd, spec, LEVEL, sdWithin);
  const out: WindowFigures = {
    kind: 'summary',
    n: d.n,
    mean: d.mean,
    sdOverall: d.sd,
    yield: 1 - b.tails.total,
    zLevel: b.tails.zLevel,
    model: 'normal',
    bounds: {}
  };
  if (b.within) out.sdWithin = b.within.sd;
  if (b.within?.indices.k !== undefined) out.cpk = b.within.indices.k;
  if (b.overall.k !== undefined) out.ppk = b.overall.k;
  out.ppmTotal = b.tails.total * 1e6;
  if (b.within?.cpkLower !== undefined) out.bounds.cpkLower = b.within.cpkLower;
  if (b.ppkLower !== undefined) out.bounds.ppkLower = b.ppkLower;
  if (b.zLevelLower !== undefined) out.bounds.zLevelLower = b.zLevelLower;
  // Through ppm and back, as windowFiguresOf does with a full result: the same number to the last bit.
  if (b.fractionUpper !== undefined) out.bounds.fractionUpper = (b.fractionUpper * 1e6) / 1e6;
  return out;
}
