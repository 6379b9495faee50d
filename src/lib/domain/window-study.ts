import { pooledWithinSd } from '../stats/pooled-moments';
import { poolSummaries, summariseValues } from './combine-study-data';
import type { Study, StudyData, SummaryData } from './study';

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
    const parts: SummaryData[] = sorted.map((s) =>
      s.data.kind === 'summary' ? s.data : summariseValues((s.data as { values: number[] }).values)
    );
    const pooled = parts.reduce((a, b) => poolSummaries(a, b));
    const sdWithin = pooledWithinSd(parts);
    return { data: pooled, months, ...(sdWithin !== undefined ? { sdWithin } : {}) };
  }
  if (kinds.size === 1 && kinds.has('defectives')) {
    let units = 0;
    let defectives = 0;
    for (const s of sorted) {
      if (s.data.kind !== 'defectives') continue;
      units += s.data.units;
      defectives += s.data.defectives;
    }
    return { data: { kind: 'defectives', units, defectives }, months };
  }
  if (kinds.size === 1 && kinds.has('defects')) {
    const counts = sorted.flatMap((s) => (s.data.kind === 'defects' ? [s.data] : []));
    const opps = new Set(counts.map((d) => d.opportunitiesPerUnit));
    const defects = counts.reduce((a, d) => a + d.defects, 0);
    if (opps.size === 1) {
      const units = counts.reduce((a, d) => a + d.units, 0);
      return { data: { kind: 'defects', units, defects, opportunitiesPerUnit: [...opps][0]! }, months };
    }
    // Different opportunity counts: compare on defects per opportunity, as one unit with all opportunities.
    const opportunities = counts.reduce((a, d) => a + d.units * d.opportunitiesPerUnit, 0);
    return { data: { kind: 'defects', units: opportunities, defects, opportunitiesPerUnit: 1 }, months };
  }
  return undefined;
}
