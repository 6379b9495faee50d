import type { MergeConflict } from './change-set-merge';
import { emptyRecords, RECORD_KINDS, parentIdOf, type RecordKind, type RecordsByKind } from './record-kinds';
import { mergeRecord, type ConflictRule, type MergeKind } from './record-merge';
import { compareById, isLive, type RecordMeta, type WriteContext } from './record-meta';
import { commandLineWriter, mergeRecordSets } from './record-set-merge';
import type { Study } from './study';
import { studyMonthKey } from './study-month';

/**
 * Many record sets gathered into one (the command line's `gather` of a shared folder): the same result as
 * merging them one after the other with `mergeRecordSets`, in the order given.
 *
 * Fast path. Each record's versions are merged with `mergeRecord` in source order, which is exactly what the
 * one-by-one merge does for a record when no conflict arises, at the cost of one pass over the records
 * instead of one index per source. The result is then checked for the conflicts that span records: a month
 * with two live studies, or a live record under a deleted parent. When any record conflicts or such a check
 * fails, the one-by-one merge runs instead, so that families and months are settled by the same code as
 * everywhere else. (A property test holds the two paths equal.)
 */
export interface GatherSource {
  name: string;
  records: RecordsByKind;
}

export interface GatheredRecords {
  records: RecordsByKind;
  /** Conflicts still open in the result (none when a rule was given), each with the source that raised it. */
  conflicts: { source: string; conflict: MergeConflict }[];
  /** What each source brought, by merge outcome (a source's records compared with all before it). */
  counts: Record<MergeKind, number>;
  /** Whether the one-by-one merge was needed (a conflict, or a check across records failed). */
  path: 'fast' | 'one-by-one';
}

const zeroCounts = (): Record<MergeKind, number> => ({
  new: 0,
  updated: 0,
  deleted: 0,
  unchanged: 0,
  conflict: 0
});

function fastGather(
  sources: readonly GatherSource[]
): { records: RecordsByKind; counts: Record<MergeKind, number> } | undefined {
  const byId = new Map<string, { kind: RecordKind; record: RecordMeta }>();
  const counts = zeroCounts();
  for (const source of sources) {
    for (const kind of RECORD_KINDS) {
      for (const record of source.records[kind] as RecordMeta[]) {
        const here = byId.get(record.id);
        if (here && here.kind !== kind) return undefined;
        const decision = mergeRecord(here?.record, record);
        if (decision.kind === 'conflict') return undefined;
        counts[decision.kind] += 1;
        if (decision.write) byId.set(record.id, { kind, record: decision.write });
      }
    }
  }
  const out = Object.fromEntries(RECORD_KINDS.map((k) => [k, [] as RecordMeta[]])) as unknown as Record<
    RecordKind,
    RecordMeta[]
  >;
  const liveMonths = new Set<string>();
  for (const { kind, record } of byId.values()) {
    if (isLive(record)) {
      const parent = parentIdOf(kind, record);
      const parentRecord = parent === undefined ? undefined : byId.get(parent)?.record;
      if (parentRecord && !isLive(parentRecord)) return undefined;
      if (kind === 'studies') {
        const month = studyMonthKey(record as Study);
        if (liveMonths.has(month)) return undefined;
        liveMonths.add(month);
      }
    }
    out[kind].push(record);
  }
  for (const kind of RECORD_KINDS) out[kind].sort(compareById);
  return { records: out as unknown as RecordsByKind, counts };
}

export function gatherRecordSets(
  sources: readonly GatherSource[],
  rule?: ConflictRule,
  writer: WriteContext = commandLineWriter()
): GatheredRecords {
  const fast = fastGather(sources);
  if (fast) return { ...fast, conflicts: [], path: 'fast' };
  let records = emptyRecords();
  const counts = zeroCounts();
  const raised: { source: string; conflict: MergeConflict }[] = [];
  for (const source of sources) {
    const merged = mergeRecordSets(records, source.records, rule, writer);
    records = merged.records;
    for (const k of Object.keys(counts) as MergeKind[]) counts[k] += merged.counts[k];
    for (const conflict of merged.conflicts) raised.push({ source: source.name, conflict });
  }
  if (rule || raised.length === 0) return { records, counts, conflicts: [], path: 'one-by-one' };
  // A conflict raised by one source may be settled by a later one (a device that has already settled it
  // sends a version that supersedes both). What is still open is what a source raises against the result.
  const open: { source: string; conflict: MergeConflict }[] = [];
  const seen = new Set<string>();
  for (const source of sources) {
    for (const conflict of mergeRecordSets(records, source.records, undefined, writer).conflicts) {
      if (seen.has(conflict.key)) continue;
      seen.add(conflict.key);
      open.push({ source: source.name, conflict });
    }
  }
  return { records, counts, conflicts: open, path: 'one-by-one' };
}
