import { z } from 'zod';
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
import { periodProblem } from './period';
import type { StudyFields } from './study';

/**
 * The validation of a study and its data (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
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
