import { mergedRecordSet, planMerge, settleMerge, type MergeConflict } from './change-set-merge';
import type { RecordsByKind } from './record-kinds';
import { RecordIndex } from './record-index';
import type { ConflictRule, MergeKind } from './record-merge';
import type { WriteContext } from './record-meta';

/**
 * Merge of two whole record sets — what the command line's `merge` does with two files, and what the property
 * tests hold the database merge to. Records only in `base` stay; the rest follow `planMerge`. With a rule,
 * every conflict is settled by it (and the settling writes are made by `writer`); without one, the conflicts
 * are listed and only the records that merge without asking change.
 */
export interface RecordSetMerge {
  records: RecordsByKind;
  counts: Record<MergeKind, number>;
  conflicts: MergeConflict[];
}

/** The writer of settling revisions made outside any device (the command line). */
export function commandLineWriter(now: () => Date = () => new Date()): WriteContext {
  return { deviceId: 'command-line', now, newId: () => crypto.randomUUID() };
}

export function mergeRecordSets(
  base: RecordsByKind,
  incoming: RecordsByKind,
  rule?: ConflictRule,
  writer: WriteContext = commandLineWriter()
): RecordSetMerge {
  const index = new RecordIndex(base);
  const plan = planMerge(index, incoming);
  if (rule || plan.conflicts.length === 0) {
    for (const { kind, record } of settleMerge(index, plan, { rule: rule ?? 'newer' }, writer))
      index.set(kind, record);
  } else {
    for (const { kind, decision } of plan.decisions)
      if (decision.kind !== 'conflict' && decision.write) index.set(kind, decision.write);
  }
  return { records: mergedRecordSet(index), counts: plan.counts, conflicts: plan.conflicts };
}
