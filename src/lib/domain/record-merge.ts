import { canonicalJson } from './canonical-json';
import { compareEdits } from './edit-order';
import { META_KEYS, clockOf, travelling, versionOf, type RecordMeta } from './record-meta';

export { compareEdits, editTimeOf, newerReason } from './edit-order';
import { compareVersions, joinVersions, writeCount } from './version-vector';

/**
 * The merge of one record: the version on this side (`local`, if any) against the one arriving (`incoming`).
 *
 * Rules (README, "How files merge"):
 * - the version vectors decide: if one side has seen every write of the other, it wins and nothing is asked;
 * - equal vectors with equal content change nothing (importing the same file twice is a no-op);
 * - vectors that each hold a write the other lacks mean both sides changed the record since they last met:
 *   a conflict — unless both arrived at the same content (then the versions are simply combined). A deletion
 *   against an edit is such a conflict, never a silent loss or resurrection; two deletions agree;
 * - equal vectors with different content (two people resolved the same conflict differently) are a conflict too.
 *
 * Because the decision depends only on the two versions, merging in any order reaches the same result for
 * every record that has no conflict, and a record is only ever replaced by a version that has seen it.
 */
export type MergeKind = 'new' | 'updated' | 'deleted' | 'unchanged' | 'conflict';

export type ConflictNature = 'both-edited' | 'deleted-here' | 'deleted-there' | 'diverged';

export interface MergeDecision<T extends RecordMeta> {
  kind: MergeKind;
  incoming: T;
  local?: T;
  /** What to store (absent for `unchanged` and for an unresolved conflict). */
  write?: T;
  /** For a conflict: how the sides differ and which top-level fields differ. */
  nature?: ConflictNature;
  fields?: string[];
}

const META = new Set<string>(META_KEYS);

/** The record without its bookkeeping, as canonical text: what a person would call "the same record". */
export function contentOf(record: RecordMeta): string {
  const fields: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(record)) if (!META.has(key)) fields[key] = value;
  return canonicalJson(fields);
}

const isTombstone = (r: RecordMeta) => r.deletedAt !== undefined;

/** Deep equality of JSON-like values, keys with `undefined` counting as absent (as in canonical JSON). */
function sameValue(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const y = b as unknown[];
    if (a.length !== y.length) return false;
    for (let i = 0; i < a.length; i++) if (!sameValue(a[i], y[i])) return false;
    return true;
  }
  return sameFieldsExcept(a as Record<string, unknown>, b as Record<string, unknown>, undefined);
}

function sameFieldsExcept(
  a: Record<string, unknown>,
  b: Record<string, unknown>,
  skip: Set<string> | undefined
) {
  for (const key of Object.keys(a)) {
    if (skip?.has(key)) continue;
    if (!sameValue(a[key], b[key])) return false;
  }
  for (const key of Object.keys(b)) {
    if (skip?.has(key)) continue;
    if (a[key] === undefined && b[key] !== undefined) return false;
  }
  return true;
}

/** Same content (bookkeeping left out) and same deletion state: `contentOf` equality without writing text. */
export function sameContent(a: RecordMeta, b: RecordMeta): boolean {
  return (
    isTombstone(a) === isTombstone(b) &&
    sameFieldsExcept(a as unknown as Record<string, unknown>, b as unknown as Record<string, unknown>, META)
  );
}

/** Top-level fields whose values differ (bookkeeping left out; a deletion shows as `deleted`). */
export function differingFields(a: RecordMeta, b: RecordMeta): string[] {
  const out: string[] = [];
  if (isTombstone(a) !== isTombstone(b)) out.push('deleted');
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
  for (const key of [...keys].sort()) {
    if (META.has(key)) continue;
    const x = canonicalJson((a as unknown as Record<string, unknown>)[key] ?? null);
    const y = canonicalJson((b as unknown as Record<string, unknown>)[key] ?? null);
    if (x !== y) out.push(key);
  }
  return out;
}

/** The version the "newer edit wins" rule keeps (see `compareEdits`). */
export function newerOf<T extends RecordMeta>(a: T, b: T): T {
  return compareEdits(a, b) >= 0 ? a : b;
}

/**
 * The stored result of settling a pair in favour of `winner`: its content and stamps, with a version vector
 * that has seen both sides, so the result supersedes both wherever it travels. No new write is counted, so
 * two devices that settle the same pair the same way store identical records.
 */
export function settle<T extends RecordMeta>(winner: T, other: T): T {
  const vv = joinVersions(versionOf(winner), versionOf(other));
  const out = { ...winner, vv, rev: writeCount(vv), clock: clockOf(winner) } as T;
  delete out.localSeq;
  return out;
}

export function mergeRecord<T extends RecordMeta>(local: T | undefined, incoming: T): MergeDecision<T> {
  if (!local) {
    return { kind: isTombstone(incoming) ? 'deleted' : 'new', incoming, write: travelling(incoming) };
  }
  const order = compareVersions(versionOf(incoming), versionOf(local));
  switch (order) {
    case 'equal':
      if (sameContent(local, incoming)) return { kind: 'unchanged', incoming, local };
      return conflict(local, incoming, 'diverged');
    case 'before':
      return { kind: 'unchanged', incoming, local };
    case 'after':
      return {
        kind: isTombstone(incoming) && !isTombstone(local) ? 'deleted' : 'updated',
        incoming,
        local,
        write: travelling(incoming)
      };
    case 'concurrent': {
      if (sameContent(local, incoming) || (isTombstone(local) && isTombstone(incoming))) {
        const winner = newerOf(local, incoming);
        return {
          kind: 'updated',
          incoming,
          local,
          write: settle(winner, winner === local ? incoming : local)
        };
      }
      const nature: ConflictNature = isTombstone(local)
        ? 'deleted-here'
        : isTombstone(incoming)
          ? 'deleted-there'
          : 'both-edited';
      return conflict(local, incoming, nature);
    }
  }
}

function conflict<T extends RecordMeta>(local: T, incoming: T, nature: ConflictNature): MergeDecision<T> {
  return { kind: 'conflict', incoming, local, nature, fields: differingFields(local, incoming) };
}

export type ConflictRule = 'newer' | 'local' | 'incoming';

/** Settles a conflict by a rule: the newer edit, or always this side's, or always the file's. */
export function settleConflict<T extends RecordMeta>(decision: MergeDecision<T>, rule: ConflictRule): T {
  const { local, incoming } = decision;
  if (!local) return travelling(incoming);
  const winner = rule === 'local' ? local : rule === 'incoming' ? incoming : newerOf(local, incoming);
  return settle(winner, winner === local ? incoming : local);
}
