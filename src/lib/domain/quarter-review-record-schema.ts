import { z } from 'zod';
import { parseFields } from './parse-fields';
import { MAX_NOTE_LENGTH, REVIEW_SECTIONS, type QuarterReviewFields } from './quarter-review-record';
import { isoTime } from './record-meta-schema';
import { reviewFiguresSchema } from './review-figures';

/**
 * The validation of a quarterly review record (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
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
