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

/**
 * Months of counts added one by one (in month order), pooled by the rules below: the one home of those rules, for
 * months given as records (poolDefectiveMonths, poolDefectMonths) and as read-model cells (the portfolio's
 * ranking, which reuses one fold rather than building an array of objects per window).
 */
export class CountsFold {
  #units = 0;
  #count = 0;
  #opportunities = 0;
  #perUnit = NaN;
  #samePerUnit = true;

  reset(): this {
    this.#units = this.#count = this.#opportunities = 0;
    this.#perUnit = NaN;
    this.#samePerUnit = true;
    return this;
  }

  /** A month's units and count (defectives or defects), with its opportunities per unit for defects. */
  add(units: number, count: number, opportunitiesPerUnit = 1): this {
    if (Number.isNaN(this.#perUnit)) this.#perUnit = opportunitiesPerUnit;
    else if (opportunitiesPerUnit !== this.#perUnit) this.#samePerUnit = false;
    this.#units += units;
    this.#count += count;
    this.#opportunities += units * opportunitiesPerUnit;
    return this;
  }

  /** Months of defectives counts: units and defectives summed. */
  defectives(): DefectivesData {
    return { kind: 'defectives', units: this.#units, defectives: this.#count };
  }

  /**
   * Months of defect counts: summed when every month has the same opportunities per unit; otherwise compared on
   * defects per opportunity, as one unit with all opportunities.
   */
  defects(): DefectsData {
    return this.#samePerUnit
      ? { kind: 'defects', units: this.#units, defects: this.#count, opportunitiesPerUnit: this.#perUnit }
      : { kind: 'defects', units: this.#opportunities, defects: this.#count, opportunitiesPerUnit: 1 };
  }
}

/** Months of defectives counts pooled (CountsFold.defectives). */
export function poolDefectiveMonths(counts: readonly Omit<DefectivesData, 'kind'>[]): DefectivesData {
  const fold = new CountsFold();
  for (const d of counts) fold.add(d.units, d.defectives);
  return fold.defectives();
}

/** Months of defect counts pooled (CountsFold.defects). */
export function poolDefectMonths(counts: readonly Omit<DefectsData, 'kind'>[]): DefectsData {
  const fold = new CountsFold();
  for (const d of counts) fold.add(d.units, d.defects, d.opportunitiesPerUnit);
  return fold.defects();
}
