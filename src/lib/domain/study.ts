import type { Characteristic } from './characteristic';
import type { Period } from './period';
import type { RecordMeta } from './record-meta';
import { ValidationError } from './validation-error';
import { resolutionOf } from './figure-format';

/** Individual measurements, in the order taken; `subgroups[i]` names the subgroup of `values[i]`. */
export interface RawData {
  kind: 'raw';
  values: number[];
  subgroups?: string[];
}
/** Only the summary a site reported. Normality and stability cannot be checked from it. */
export interface SummaryData {
  kind: 'summary';
  n: number;
  mean: number;
  /** Sample standard deviation (n − 1 divisor) as reported. */
  sd: number;
}
/** Units inspected and how many of them were defective (binomial count). */
export interface DefectivesData {
  kind: 'defectives';
  units: number;
  defectives: number;
}
/** Units inspected and defects found, each unit offering `opportunitiesPerUnit` chances of a defect (Poisson count). */
export interface DefectsData {
  kind: 'defects';
  units: number;
  defects: number;
  opportunitiesPerUnit: number;
}
export type StudyData = RawData | SummaryData | DefectivesData | DefectsData;

/** One characteristic's results for one month. */
export interface StudyFields {
  characteristicId: string;
  period: Period;
  data: StudyData;
  /** Name of the person who entered it, as set on the entering device. */
  enteredBy: string;
  note?: string;
}
export type Study = StudyFields & RecordMeta;

/** Measured characteristics take raw or summary data; counted ones take defectives or defects. */
export function assertStudyFitsCharacteristic(study: StudyFields, characteristic: Characteristic): void {
  const measured = study.data.kind === 'raw' || study.data.kind === 'summary';
  if (measured !== (characteristic.dataKind === 'measured')) {
    throw new ValidationError('Study', [
      {
        field: 'data.kind',
        message: `'${characteristic.name}' is a ${characteristic.dataKind} characteristic; ${study.data.kind} data does not fit it`
      }
    ]);
  }
}

/** Sample size of a study whatever its kind: values, reported n, or units inspected. */
export function sampleSize(data: StudyData): number {
  switch (data.kind) {
    case 'raw':
      return data.values.length;
    case 'summary':
      return data.n;
    case 'defectives':
    case 'defects':
      return data.units;
  }
}

/**
 * The resolution of a measured study's data (decimals, figure-format.ts): of its values; for a summary, one
 * fewer than its mean and sd were entered with, so that they show as entered (a statistic is written one
 * decimal finer than its data). Counts have none: 0.
 */
export function resolutionOfStudy(data: StudyData): number {
  switch (data.kind) {
    case 'raw':
      return resolutionOf(data.values);
    case 'summary':
      return Math.max(0, resolutionOf([data.mean, data.sd]) - 1);
    default:
      return 0;
  }
}
