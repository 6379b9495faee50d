import { z } from 'zod';
import { RISK_CLASSES } from './characteristic';
import type { ContextProfileFields } from './context-profile-record';
import { finiteNumber, optionalText, requiredText } from './field-rules';
import { parseFields } from './parse-fields';

/**
 * The validation of a stored context profile (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
const level = (label: string) =>
  finiteNumber(label)
    .positive({ error: `${label} must be above zero` })
    .max(1e6, { error: `${label} must be at most 1,000,000 (ppm) or an index or z-level below that` });

export const contextProfileFieldsSchema = z.object({
  contextId: z.string({ error: 'Context id is required' }).regex(/^[a-z0-9][a-z0-9-]{1,59}$/, {
    error: 'Context id must be 2–60 lowercase letters, digits or hyphens'
  }),
  label: requiredText('Context name', 120),
  measure: z.enum(['index', 'zLevel', 'ppm'], {
    error: "The ruling measure must be 'index', 'zLevel' or 'ppm'"
  }),
  levels: z.object(
    Object.fromEntries(
      RISK_CLASSES.map((r) => [r, level(`Required level for ${r} characteristics`)])
    ) as Record<(typeof RISK_CLASSES)[number], ReturnType<typeof level>>
  ),
  reporting: z.enum(['long-term', 'short-term'], { error: "Reporting must be 'long-term' or 'short-term'" }),
  confidence: finiteNumber('Confidence level')
    .gt(0.5, { error: 'Confidence level must lie between 0.5 and 1' })
    .lt(1, { error: 'Confidence level must lie between 0.5 and 1' }),
  source: optionalText('Source note', 1000)
});

export function parseContextProfileFields(input: unknown): ContextProfileFields {
  return parseFields('Context profile', contextProfileFieldsSchema, input) as ContextProfileFields;
}
