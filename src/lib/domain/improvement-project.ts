import { z } from 'zod';
import { describeValue, nonNegativeNumber, optionalText, recordId, requiredText } from './field-rules';
import { isCalendarDate } from './time-bounds';
import { parseFields } from './parse-fields';
import type { RecordMeta } from './record-meta';

/** The DMAIC phases, in order. */
export const PROJECT_PHASES = ['Define', 'Measure', 'Analyze', 'Improve', 'Control'] as const;
export type ProjectPhase = (typeof PROJECT_PHASES)[number];

/** An improvement project aimed at one process. */
export interface ImprovementProjectFields {
  processId: string;
  title: string;
  phase: ProjectPhase;
  owner: string;
  /** Calendar dates written YYYY-MM-DD. */
  startDate: string;
  targetDate?: string;
  /** Expected saving per year once the project holds its gain, in the process's currency. */
  expectedAnnualSaving: number;
}
export type ImprovementProject = ImprovementProjectFields & RecordMeta;

const calendarDate = (label: string) =>
  z.string({ error: `${label} is required` }).refine(isCalendarDate, {
    error: (issue) =>
      `${label} ${describeValue(issue.input)} is not a real date between 1970 and 2199 written YYYY-MM-DD`
  });

export const improvementProjectFieldsSchema = z
  .object({
    processId: recordId('Process'),
    title: requiredText('Project title', 200),
    phase: z.enum(PROJECT_PHASES, { error: `Phase must be one of ${PROJECT_PHASES.join(', ')}` }),
    owner: optionalText('Owner', 120),
    startDate: calendarDate('Start date'),
    targetDate: calendarDate('Target date').optional(),
    expectedAnnualSaving: nonNegativeNumber('Expected annual saving')
  })
  .superRefine((p, ctx) => {
    if (p.targetDate !== undefined && p.targetDate < p.startDate) {
      ctx.addIssue({
        code: 'custom',
        path: ['targetDate'],
        message: `Target date ${p.targetDate} is before start date ${p.startDate}`
      });
    }
  });

export function parseImprovementProjectFields(input: unknown): ImprovementProjectFields {
  return parseFields('Improvement project', improvementProjectFieldsSchema, input);
}
