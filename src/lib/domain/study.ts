import { z } from 'zod';
import type { Characteristic } from './characteristic';
import {
  count,
  describeValue,
  MAX_MEASURE,
  measureNumber,
  nonNegativeNumber,
  optionalText,
  recordId
} from './field-rules';
import { parseFields } from './parse-fields';
import { periodProblem, type Period } from './period';
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

const MAX_RAW_VALUES = 2_000_000;

const rawSchema = z
  .object({
    kind: z.literal('raw'),
    values: z
      .array(
        z
          .number({ error: (issue) => `measurement ${describeValue(issue.input)} is not a finite number` })
          .min(-MAX_MEASURE, {
            error: (issue) => `measurement ${describeValue(issue.input)} is implausibly large`
          })
          .max(MAX_MEASURE, {
            error: (issue) => `measurement ${describeValue(issue.input)} is implausibly large`
          }),
        { error: 'Values must be a list of numbers' }
      )
      .min(1, { error: 'Raw data needs at least one measurement' })
      .max(MAX_RAW_VALUES, { error: `At most ${MAX_RAW_VALUES} measurements per study` }),
    subgroups: z.array(z.string({ error: 'Subgroup ids must be text' }).max(80)).optional()
  })
  .superRefine((d, ctx) => {
    if (d.subgroups !== undefined && d.subgroups.length !== d.values.length) {
      ctx.addIssue({
        code: 'custom',
        path: ['subgroups'],
        message: `${d.subgroups.length} subgroup ids for ${d.values.length} measurements: give one per value or none`
      });
    }
  });

const summarySchema = z.object({
  kind: z.literal('summary'),
  n: count('n').min(2, { error: 'n must be at least 2 for a standard deviation to exist' }),
  mean: measureNumber('Mean'),
  sd: nonNegativeNumber('Standard deviation', MAX_MEASURE)
});

const defectivesSchema = z
  .object({
    kind: z.literal('defectives'),
    units: count('Units inspected').min(1, { error: 'Units inspected must be at least 1' }),
    defectives: count('Defectives')
  })
  .superRefine((d, ctx) => {
    if (d.defectives > d.units) {
      ctx.addIssue({
        code: 'custom',
        path: ['defectives'],
        message: `Defectives (${d.defectives}) cannot exceed units inspected (${d.units})`
      });
    }
  });

const defectsSchema = z
  .object({
    kind: z.literal('defects'),
    units: count('Units inspected').min(1, { error: 'Units inspected must be at least 1' }),
    defects: count('Defects'),
    opportunitiesPerUnit: count('Opportunities per unit').min(1, {
      error: 'Opportunities per unit must be at least 1'
    })
  })
  .superRefine((d, ctx) => {
    if (d.defects > d.units * d.opportunitiesPerUnit) {
      ctx.addIssue({
        code: 'custom',
        path: ['defects'],
        message: `Defects (${d.defects}) cannot exceed units × opportunities (${d.units * d.opportunitiesPerUnit})`
      });
    }
  });

export const studyDataSchema = z.discriminatedUnion(
  'kind',
  [rawSchema, summarySchema, defectivesSchema, defectsSchema],
  {
    error: "Data kind must be one of 'raw', 'summary', 'defectives', 'defects'"
  }
);

export const studyFieldsSchema = z.object({
  characteristicId: recordId('Characteristic'),
  period: z.string({ error: 'Period is required' }).refine((p) => periodProblem(p) === undefined, {
    error: (issue) => periodProblem(issue.input) ?? 'Period is not valid'
  }),
  data: studyDataSchema,
  enteredBy: optionalText('Entered by', 120),
  note: optionalText('Note', 2000).optional()
});

export function parseStudyFields(input: unknown): StudyFields {
  return parseFields('Study', studyFieldsSchema, input);
}

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
