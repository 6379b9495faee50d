import { z } from 'zod';
import { parseFields } from './parse-fields';
import type { RecordMeta } from './record-meta';
import { isoTime } from './record-meta-schema';
import { reviewFiguresSchema, type ReviewFigures } from './review-figures';

/**
 * A quarterly review as kept: which quarter and sites, the manager's comment on each section, and, once the
 * review has been presented, a frozen copy of its figures. Synchronised like every other record, so notes and
 * snapshots travel in exchange files.
 */
export const REVIEW_SECTIONS = [
  'headline',
  'shortfalls',
  'movers',
  'sites',
  'pipeline',
  'assumptions'
] as const;
export type ReviewSection = (typeof REVIEW_SECTIONS)[number];

export interface QuarterReviewFields {
  quarter: string;
  /** Sorted; empty means every site. */
  siteIds: string[];
  notes: Partial<Record<ReviewSection, string>>;
  snapshot?: { frozenAt: string; figures: ReviewFigures };
}
export type QuarterReviewRecord = QuarterReviewFields & RecordMeta;

export const MAX_NOTE_LENGTH = 4000;

export const quarterReviewFieldsSchema = z.object({
  quarter: z
    .string({ error: 'Quarter is required' })
    .regex(/^\d{4}-Q[1-4]$/, { error: 'Quarter must be written YYYY-Qn' }),
  siteIds: z.array(z.string().uuid({ error: 'Site ids must be record ids (UUID)' })).max(1000),
  notes: z.partialRecord(
    z.enum(REVIEW_SECTIONS, { error: `Note sections are ${REVIEW_SECTIONS.join(', ')}` }),
    z
      .string({ error: 'A note must be text' })
      .max(MAX_NOTE_LENGTH, { error: `A note must be at most ${MAX_NOTE_LENGTH} characters` })
  ),
  snapshot: z
    .object({
      frozenAt: isoTime('frozenAt'),
      figures: reviewFiguresSchema
    })
    .optional()
});

export function parseQuarterReviewFields(input: unknown): QuarterReviewFields {
  const fields = parseFields('Quarterly review', quarterReviewFieldsSchema, input) as QuarterReviewFields;
  return { ...fields, siteIds: [...fields.siteIds].sort() };
}

/** Which review a quarter and a set of sites name (the set in any order). */
export function reviewKey(quarter: string, siteIds: readonly string[]): string {
  return `${quarter}|${[...siteIds].sort().join(',')}`;
}
