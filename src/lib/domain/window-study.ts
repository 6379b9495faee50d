import { MomentsFold, type Moments } from '../stats/pooled-moments';
import { summariseValues } from './combine-study-data';
import type { DefectivesData, DefectsData, Study, StudyData } from './study';

/**
 * One characteristic's studies over a window of months, combined exactly into one data set — never by averaging
 * indices:
 * - all raw: the values pooled; each month (or each month's own subgroup) becomes a subgroup, so the within sigma
 *   stays within months and a shift between months shows only in the overall sigma;
 * - any summary among them: the months merged by the exact pooled mean and variance (Chan, Golub & LeVeque),
 *   with the within sigma the pooled within-month sd √(Σ(nᵢ−1)sᵢ²/Σ(nᵢ−1));
 * - counts: units and defectives or defects summed.
 */
export interface WindowData {
  data: StudyData;
  months: string[];
  /** Pooled within-month sd, for merged summaries only (raw data carry their own subgroups). */
  sdWithin?: number;
}

export function windowData(studies: readonly Study[]): WindowData | undefined {
  if (studies.length === 0) return undefined;
  const sorted = [...studies].sort((a, b) => a.period.localeCompare(b.period));
  const months = sorted.map((s) => s.period);
  const kinds = new Set(sorted.map((s) => s.data.kind));
  if (kinds.size === 1 && kinds.has('raw')) {
    if (sorted.length === 1) return { data: sorted[0]!.data, months };
    const values: number[] = [];
    const subgroups: string[] = [];
    for (const s of sorted) {
      if (s.data.kind !== 'raw') continue;
      const d = s.data;
      d.values.forEach((v, i) => {
        values.push(v);
        subgroups.push(d.subgroups ? `${s.period}/${d.subgroups[i]}` : s.period);
      });
    }
    return { data: { kind: 'raw', values, subgroups }, months };
  }
  if ([...kinds].every((k) => k === 'raw' || k === 'summary')) {
    const parts: Moments[] = sorted.map((s) =>
      s.data.kind === 'summary' ? s.data : summariseValues((s.data as { values: number[] }).values)
    );
    return { ...poolMeasuredMonths(parts), months };
  }
  if (kinds.size === 1 && kinds.has('defectives'))
    return { data: poolDefectiveMonths(sorted.map((s) => s.data as DefectivesData)), months };
  if (kinds.size === 1 && kinds.has('defects'))
    return { data: poolDefectMonths(sorted.map((s) => s.data as DefectsData)), months };
  return undefined;
}

/**
 * Months of measured data (each as n, mean, sd) merged in month order by the exact pooled mean and variance, with
 * the pooled within-month sd. The one rule for a measured window that is not all raw; the ranking pools the read
 * model's cells (monthly-statistics.ts) by the same fold, through measuredWindowOf.
 */
export function poolMeasuredMonths(parts: readonly Moments[]): Pick<WindowData, 'data' | 'sdWithin'> {
  const fold = new MomentsFold();
  for (const p of parts) fold.add(p.n, p.mean, p.sd);
  return measuredWindowOf(fold);
}

/** The window of months pooled into `fold` (MomentsFold, in month order): what poolMeasuredMonths gives for them. */
export function measuredWindowOf(fold: MomentsFold): Pick<WindowData, 'data' | 'sdWithin'> {
  const sdWithin = fold.withinSd();
  const data: StudyData = { kind: 'summary', n: fold.n, mean: fold.mean, sd: fold.sd };
  return sdWithin !== undefined ? { data, sdWithin } : { data };
}

/** Months of defectives counts: units and defectives summed. */
export function poolDefectiveMonths(counts: readonly Omit<DefectivesData, 'kind'>[]): DefectivesData {
  let units = 0;
  let defectives = 0;
  for (const d of counts) {
    units += d.units;
    defectives += d.defectives;
  }
  return { kind: 'defectives', units, defectives };
}

/**
 * Months of defect counts: summed when every month has the same opportunities per unit; otherwise compared on
 * defects per opportunity, as one unit with all opportunities.
 */
export function poolDefectMonths(counts: readonly Omit<DefectsData, 'kind'>[]): DefectsData {
  let defects = 0;
  let units = 0;
  let opportunities = 0;
  let same = true;
  for (const d of counts) {
    defects += d.defects;
    units += d.units;
    opportunities += d.units * d.opportunitiesPerUnit;
    if (d.opportunitiesPerUnit !== counts[0]!.opportunitiesPerUnit) same = false;
  }
  return same
    ? { kind: 'defects', units, defects, opportunitiesPerUnit: counts[0]!.opportunitiesPerUnit }
    : { kind: 'defects', units: opportunities, defects, opportunitiesPerUnit: 1 };
}
