import { sortById } from './id-order';
import { MergeRefused, zeroCounts, type MergeConflict } from './change-set-merge';
import {
  CHILD_KINDS,
  emptyRecords,
  RECORD_KINDS,
  parentIdOf,
  type RecordKind,
  type RecordsByKind
} from './record-kinds';
import { mergeRecord, sameContent, type ConflictRule, type MergeKind } from './record-merge';
import { compareVersions } from './version-vector';
import { isLive, travelling, versionOf, type RecordMeta, type WriteContext } from './record-meta';
import { commandLineWriter, mergeRecordSets } from './record-set-merge';
import type { Study } from './study';
import { StudyMonthSet } from './study-month';

/**
 * Many record sets gathered into one (the command line's `gather` of a shared folder). The result supersedes
 * every version in every set (its version vector has seen each), and is what merging them one after the other
 * with `mergeRecordSets` gives whenever that raises no conflict.
 *
 * Fast path. For each record, the versions that no other version has seen are kept, and if they are more than
 * one they must agree (same content, or all deletions) and are settled as `mergeRecord` settles them: the
 * result is then the one version that has seen every other. This is what the set-by-set merge gives when it
 * raises no conflict, in one pass over the records instead of one index per set, and a version a later set
 * already supersedes never stops it. The result is then checked for the conflicts that span records: a month
 * with two live studies, or a live record under a deleted parent. When any record conflicts or such a check
 * fails, the merge runs set by set instead, so that families and months are settled by the same code as
 * everywhere else: first without a rule and until a round changes nothing, so that a conflict a later set has
 * already settled is not reported (nor settled again: two settlements of one month by different choices can
 * delete both its studies); only if conflicts are still open does the rule settle them, set by set from the
 * start, as `merge` does with two files.
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
  /** Why a rule given could not settle the open conflicts (they are then in `conflicts`). */
  refused?: string;
}

function fastGather(
  sources: readonly GatherSource[]
): { records: RecordsByKind; counts: Record<MergeKind, number> } | undefined {
  // For each record, the versions no other version has seen (an antichain under the version vectors): a
  // version a later set supersedes drops out, whatever came in between.
  const versions = new Map<string, { kind: RecordKind; maximal: RecordMeta[] }>();
  // When any set deleted each parent: a record deleted with a parent that is live in the end comes back with
  // it in the set-by-set merge (change-set-merge.ts, "restorable"), which this path leaves to that merge.
  const parentDeletions = new Map<string, Set<string>>();
  const counts = zeroCounts();
  for (const source of sources) {
    for (const kind of RECORD_KINDS) {
      for (const record of source.records[kind] as RecordMeta[]) {
        if (record.deletedAt !== undefined && CHILD_KINDS[kind]) {
          let instants = parentDeletions.get(record.id);
          if (!instants) parentDeletions.set(record.id, (instants = new Set()));
          instants.add(record.deletedAt);
        }
        const entry = versions.get(record.id);
        if (!entry) {
          versions.set(record.id, { kind, maximal: [record] });
          counts[isLive(record) ? 'new' : 'deleted'] += 1;
          continue;
        }
        if (entry.kind !== kind) return undefined;
        let seen = false;
        const keep: RecordMeta[] = [];
        for (const m of entry.maximal) {
          const order = compareVersions(versionOf(record), versionOf(m));
          if (order === 'equal' && !sameContent(m, record)) return undefined;
          if (order === 'equal' || order === 'before') seen = true;
          if (order !== 'after') keep.push(m);
        }
        if (!seen) keep.push(record);
        counts[seen ? 'unchanged' : 'updated'] += 1;
        entry.maximal = keep;
      }
    }
  }
  const byId = new Map<string, { kind: RecordKind; record: RecordMeta }>();
  for (const [id, { kind, maximal }] of versions) {
    const [first, ...rest] = maximal as [RecordMeta, ...RecordMeta[]];
    let record = travelling(first);
    for (const other of rest) {
      // Versions made apart that agree (same content, or both deletions) settle as the merge settles them;
      // any other difference is a conflict for the merge set by set.
      const d = mergeRecord(record, other);
      if (d.kind === 'conflict') return undefined;
      if (d.write) record = d.write;
    }
    byId.set(id, { kind, record });
  }
  const out = Object.fromEntries(RECORD_KINDS.map((k) => [k, [] as RecordMeta[]])) as unknown as Record<
    RecordKind,
    RecordMeta[]
  >;
  const liveMonths = new StudyMonthSet();
  for (const { kind, record } of byId.values()) {
    const parent = parentIdOf(kind, record);
    const parentRecord = parent === undefined ? undefined : byId.get(parent)?.record;
    if (!isLive(record) && parentRecord && isLive(parentRecord)) {
      if (parentDeletions.get(parent!)?.has(record.deletedAt!)) return undefined;
    }
    if (isLive(record)) {
      if (parentRecord && !isLive(parentRecord)) return undefined;
      if (kind === 'studies') {
        if (liveMonths.has(record as Study)) return undefined;
        liveMonths.add(record as Study);
      }
    }
    out[kind].push(record);
  }
  for (const kind of RECORD_KINDS) sortById(out[kind]);
  return { records: out as unknown as RecordsByKind, counts };
}

export function gatherRecordSets(
  sources: readonly GatherSource[],
  rule?: ConflictRule,
  writer: WriteContext = commandLineWriter()
): GatheredRecords {
  const fast = fastGather(sources);
  if (fast) return { ...fast, conflicts: [], path: 'fast' };
  // First without a rule: every version that supersedes another is taken, nothing is settled yet. A conflict
  // raised by one set may be settled by a later one (a device that already settled it sends a version that has
  // seen both), so the sets are merged again until nothing changes, and what is still open is what a set then
  // raises against the result.
  const counts = zeroCounts();
  let records = emptyRecords();
  for (const source of sources) {
    const merged = mergeRecordSets(records, source.records, undefined, writer);
    records = merged.records;
    for (const k of Object.keys(counts) as MergeKind[]) counts[k] += merged.counts[k];
  }
  const settled = untilSteady(records, sources, writer);
  if (settled.open.length === 0 || !rule)
    return { records: settled.records, counts, conflicts: settled.open, path: 'one-by-one' };
  // Conflicts are open and a rule is given: merge set by set with it from the start, as `merge` does with
  // two files; every step settles what it meets, so the result keeps the invariants at each step.
  records = emptyRecords();
  try {
    for (const source of sources) records = mergeRecordSets(records, source.records, rule, writer).records;
  } catch (error) {
    // The rule cannot settle them (for instance, bringing a deleted characteristic back would leave a month
    // with two studies): they stay open for a person, with the reason.
    if (!(error instanceof MergeRefused)) throw error;
    return {
      records: settled.records,
      counts,
      conflicts: settled.open,
      path: 'one-by-one',
      refused: error.message
    };
  }
  return { records, counts, conflicts: [], path: 'one-by-one' };
}

/** Merges every set again, without a rule, until a round changes nothing; returns what is still open. */
function untilSteady(
  start: RecordsByKind,
  sources: readonly GatherSource[],
  writer: WriteContext
): { records: RecordsByKind; open: { source: string; conflict: MergeConflict }[] } {
  let records = start;
  // Each round only moves records to versions that supersede them, so this ends; the bound is a safeguard.
  for (let round = 0; round <= sources.length; round += 1) {
    const open: { source: string; conflict: MergeConflict }[] = [];
    const seen = new Set<string>();
    let changed = false;
    for (const source of sources) {
      const merged = mergeRecordSets(records, source.records, undefined, writer);
      if (merged.counts.new + merged.counts.updated + merged.counts.deleted > 0) changed = true;
      records = merged.records;
      for (const conflict of merged.conflicts) {
        if (seen.has(conflict.key)) continue;
        seen.add(conflict.key);
        open.push({ source: source.name, conflict });
      }
    }
    if (!changed) return { records, open };
  }
  throw new Error('Gathering did not settle: a record set keeps changing the result');
}
