import { z } from 'zod';
import { RISK_CLASSES } from './characteristic';
import type { ContextProfile } from './context-profile';
import { finiteNumber, optionalText, requiredText } from './field-rules';
import { parseFields } from './parse-fields';
import type { RecordMeta } from './record-meta';

/**
 * A context profile as stored: the manager's edited version of a built-in profile, or a context of their own.
 * `contextId` is what processes refer to; the record id is a UUID like every other record, so profiles travel
 * between devices the same way.
 */
export type ContextProfileFields = Omit<ContextProfile, 'id'> & { contextId: string };
export type ContextProfileRecord = ContextProfileFields & RecordMeta;

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

/** Built-in profiles with the stored edits laid over them (by context id), plus contexts added by the user. */
export function effectiveProfiles(
  builtIn: readonly ContextProfile[],
  stored: readonly ContextProfileRecord[]
): ContextProfile[] {
  const live = stored.filter((s) => s.deletedAt === undefined);
  const byContext = new Map(live.map((s) => [s.contextId, s]));
  const toProfile = (r: ContextProfileFields): ContextProfile => ({
    id: r.contextId,
    label: r.label,
    measure: r.measure,
    levels: r.levels,
    reporting: r.reporting,
    confidence: r.confidence,
    source: r.source
  });
  const out = builtIn.map((p) => (byContext.has(p.id) ? toProfile(byContext.get(p.id)!) : p));
  for (const s of live) if (!builtIn.some((p) => p.id === s.contextId)) out.push(toProfile(s));
  return out;
}
