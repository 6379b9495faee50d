import { z } from 'zod';
import {
  describeValue,
  finiteNumber,
  nonNegativeNumber,
  optionalText,
  recordId,
  requiredText
} from './field-rules';
import { PROJECT_PHASES, PROJECT_STATES, type ImprovementProjectFields } from './improvement-project';
import { parseFields } from './parse-fields';
import { isoTime } from './record-meta-schema';
import { isCalendarDate } from './time-bounds';

/**
 * The validation of an improvement project (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
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
    expectedAnnualSaving: nonNegativeNumber('Expected annual saving'),
    phaseDates: z.partialRecord(z.enum(PROJECT_PHASES), calendarDate('Date a phase was entered')).optional(),
    targetLevel: finiteNumber('Target level')
      .positive({ error: 'Target level must be above zero' })
      .max(1e6)
      .optional(),
    state: z.enum(PROJECT_STATES, { error: "State must be 'open', 'closed' or 'cancelled'" }).optional(),
    stateReason: optionalText('Reason', 500).optional(),
    achieved: z
      .object({
        level: finiteNumber('Achieved level').optional(),
        note: optionalText('Achieved result', 1000)
      })
      .optional(),
    history: z
      .array(
        z.object({
          at: isoTime('Change time'),
          by: optionalText('Changed by', 120),
          change: optionalText('Change', 500)
        })
      )
      .max(500, { error: 'At most 500 history entries are kept' })
      .optional()
  })
  .superRefine((p, ctx) => {
    if ((p.state === 'closed' || p.state === 'cancelled') && !p.stateReason?.trim()) {
      ctx.addIssue({
        code: 'custom',
        path: ['stateReason'],
        message: `A ${p.state} project needs a reason`
      });
    }
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
