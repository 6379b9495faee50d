import { emptyRecords, RECORD_KINDS, type RecordKind, type RecordsByKind } from './record-kinds';
import {
  mergeRecord,
  settleConflict,
  type ConflictRule,
  type MergeDecision,
  type MergeKind
} from './record-merge';
import { compareById, type RecordMeta } from './record-meta';

/**
 * Merge of two whole record sets — what the command line's `merge` does with two files, and what the property
 * tests hold the database merge to. Records only in `base` stay; the rest follow `mergeRecord`. Conflicts are
 * settled by `rule` when one is given, else listed and left as in `base`.
 */
export interface RecordSetMerge {
  records: RecordsByKind;
  counts: Record<MergeKind, number>;
  conflicts: { kind: RecordKind; decision: MergeDecision<RecordMeta> }[];
}

export function mergeRecordSets(
  base: RecordsByKind,
  incoming: RecordsByKind,
  rule?: ConflictRule
): RecordSetMerge {
  const out = emptyRecords() as unknown as Record<RecordKind, RecordMeta[]>;
  const counts: Record<MergeKind, number> = { new: 0, updated: 0, deleted: 0, unchanged: 0, conflict: 0 };
  const conflicts: RecordSetMerge['conflicts'] = [];
  for (const kind of RECORD_KINDS) {
    const merged = new Map<string, RecordMeta>((base[kind] as RecordMeta[]).map((r) => [r.id, r]));
    for (const record of incoming[kind] as RecordMeta[]) {
      const decision = mergeRecord(merged.get(record.id), record);
      counts[decision.kind] += 1;
      if (decision.kind === 'conflict') {
        conflicts.push({ kind, decision });
        if (rule) merged.set(record.id, settleConflict(decision, rule));
      } else if (decision.write) {
        merged.set(record.id, decision.write);
      }
    }
    out[kind] = [...merged.values()].sort(compareById);
  }
  return { records: out as unknown as RecordsByKind, counts, conflicts };
}
