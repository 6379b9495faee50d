import type { ContextProfile } from './context-profile';
import type { RecordMeta } from './record-meta';

/**
 * A context profile as stored: the manager's edited version of a built-in profile, or a context of their own.
 * `contextId` is what processes refer to; the record id is a UUID like every other record, so profiles travel
 * between devices the same way.
 */
export type ContextProfileFields = Omit<ContextProfile, 'id'> & { contextId: string };
export type ContextProfileRecord = ContextProfileFields & RecordMeta;

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
