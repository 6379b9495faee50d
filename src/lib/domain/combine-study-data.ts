import { poolMoments, summariseMoments } from '../stats/pooled-moments';
import type { DefectivesData, DefectsData, RawData, StudyData, SummaryData } from './study';
import { ValidationError } from './validation-error';

/**
 * Combining two studies of the same characteristic and month into one, exactly — never by averaging indices.
 * - raw + raw: the values are concatenated (subgroup ids kept; values without ids get one subgroup per batch);
 * - summaries (and raw with summary): n, mean and variance pooled exactly by the pairwise update of Chan, Golub &
 *   LeVeque (1979, "Updating formulae and a pairwise algorithm for computing sample variances"):
 *   n = nA + nB, mean = mA + δ·nB/n, M2 = M2A + M2B + δ²·nA·nB/n with δ = mB − mA and M2 = (n − 1)·s²;
 * - counts: units and defectives (or defects) added; opportunities per unit must agree.
 */
export function combineStudyData(earlier: StudyData, added: StudyData): StudyData {
  if (earlier.kind === 'raw' && added.kind === 'raw') return combineRaw(earlier, added);
  if (isMeasured(earlier) && isMeasured(added)) return poolSummaries(asSummary(earlier), asSummary(added));
  if (earlier.kind === 'defectives' && added.kind === 'defectives') return addDefectives(earlier, added);
  if (earlier.kind === 'defects' && added.kind === 'defects') return addDefects(earlier, added);
  throw new ValidationError('Study', [
    {
      field: 'data.kind',
      message: `${added.kind} data cannot be combined with the ${earlier.kind} data already logged`
    }
  ]);
}

function isMeasured(d: StudyData): d is RawData | SummaryData {
  return d.kind === 'raw' || d.kind === 'summary';
}

function combineRaw(a: RawData, b: RawData): RawData {
  const values = [...a.values, ...b.values];
  if (!a.subgroups && !b.subgroups) return { kind: 'raw', values };
  const ids = (d: RawData, batch: string) => d.subgroups ?? d.values.map(() => batch);
  return { kind: 'raw', values, subgroups: [...ids(a, 'earlier'), ...ids(b, 'added')] };
}

/** Summary of raw values: n, mean and sample sd (stats/pooled-moments.ts). */
export function summariseValues(values: readonly number[]): SummaryData {
  return { kind: 'summary', ...summariseMoments(values) };
}

function asSummary(d: RawData | SummaryData): SummaryData {
  return d.kind === 'summary' ? d : summariseValues(d.values);
}

/** Two summaries merged exactly (stats/pooled-moments.ts, Chan, Golub & LeVeque). */
export function poolSummaries(a: SummaryData, b: SummaryData): SummaryData {
  return { kind: 'summary', ...poolMoments(a, b) };
}

function addDefectives(a: DefectivesData, b: DefectivesData): DefectivesData {
  return { kind: 'defectives', units: a.units + b.units, defectives: a.defectives + b.defectives };
}

function addDefects(a: DefectsData, b: DefectsData): DefectsData {
  if (a.opportunitiesPerUnit !== b.opportunitiesPerUnit) {
    throw new ValidationError('Study', [
      {
        field: 'data.opportunitiesPerUnit',
        message: `${b.opportunitiesPerUnit} opportunities per unit cannot be combined with the ${a.opportunitiesPerUnit} already logged`
      }
    ]);
  }
  return {
    kind: 'defects',
    units: a.units + b.units,
    defects: a.defects + b.defects,
    opportunitiesPerUnit: a.opportunitiesPerUnit
  };
}
