import { z } from 'zod';
import {
  describeValue,
  finiteNumber,
  nonNegativeNumber,
  optionalText,
  recordId,
  requiredText
} from './field-rules';
import { isoTime } from './record-meta-schema';
import { isCalendarDate } from './time-bounds';
import { parseFields } from './parse-fields';
import type { RecordMeta } from './record-meta';

/** The DMAIC phases, in order. */
export const PROJECT_PHASES = ['Define', 'Measure', 'Analyze', 'Improve', 'Control'] as const;
export type ProjectPhase = (typeof PROJECT_PHASES)[number];

/** Where a project stands: running, closed with its result, or cancelled (both with a reason). */
export const PROJECT_STATES = ['open', 'closed', 'cancelled'] as const;
export type ProjectState = (typeof PROJECT_STATES)[number];

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
  /** The day each phase was entered (YYYY-MM-DD). */
  phaseDates?: Partial<Record<ProjectPhase, string>>;
  /** The level the project aims at, in the context's ruling measure (an index, a z-level or ppm). */
  targetLevel?: number;
  /** Absent or 'open' while it runs; closed or cancelled with a reason. */
  state?: ProjectState;
  stateReason?: string;
  /** In the Control phase or at closing: the result achieved, in words and as a level. */
  achieved?: { level?: number; note: string };
  /** What changed, when and by whom, newest last (kept with the record, so it travels). */
  history?: { at: string; by: string; change: string }[];
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

/** Running: neither closed nor cancelled. Pipelines and badges count these only. */
export function isOpen(p: Pick<ImprovementProjectFields, 'state'>): boolean {
  return p.state === undefined || p.state === 'open';
}

/**
 * Lines saying what changed between two versions of a project, for its history: the phase, the state, dates,
 * target level, saving, result and owner, in words.
 */
export function projectChanges(before: ImprovementProjectFields, after: ImprovementProjectFields): string[] {
  const out: string[] = [];
  if (before.phase !== after.phase) out.push(`phase ${before.phase} → ${after.phase}`);
  if ((before.state ?? 'open') !== (after.state ?? 'open'))
    out.push(`${after.state ?? 'open'}${after.stateReason ? `: ${after.stateReason}` : ''}`);
  if (before.title !== after.title) out.push(`title “${after.title}”`);
  if (before.owner !== after.owner) out.push(`owner ${after.owner || '–'}`);
  if (before.targetDate !== after.targetDate) out.push(`target date ${after.targetDate ?? '–'}`);
  if (before.targetLevel !== after.targetLevel) out.push(`target level ${after.targetLevel ?? '–'}`);
  if (before.expectedAnnualSaving !== after.expectedAnnualSaving)
    out.push(`expected saving ${after.expectedAnnualSaving}`);
  if (JSON.stringify(before.achieved) !== JSON.stringify(after.achieved))
    out.push(`result: ${after.achieved?.note ?? '–'}`);
  return out;
}
