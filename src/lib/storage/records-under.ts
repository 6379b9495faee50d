import { Dexie, type Collection } from 'dexie';
import { PARENT_OF, type RecordKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import type { CapstanDatabase } from './database';

/**
 * Every record of a kind (live or not) whose parent is one of `parentIds`: the one query by parent, so that the
 * index it uses is chosen in one place. Studies have no index of their characteristic alone (schema v9): the
 * compound `[characteristicId+period]` index answers it, each characteristic a range of its first part, from its
 * lowest month to its highest. Runs inside the caller's transaction, if any.
 */
export function recordsUnder(
  db: CapstanDatabase,
  kind: RecordKind,
  parentIds: readonly string[]
): Collection<RecordMeta, string> {
  const parent = PARENT_OF[kind];
  if (!parent) throw new Error(`${kind} records have no parent`);
  const table = db.table<RecordMeta, string>(kind);
  if (kind === 'studies')
    return table.where('[characteristicId+period]').inAnyRange(
      parentIds.map((id) => [
        [id, Dexie.minKey],
        [id, Dexie.maxKey]
      ]),
      { includeUppers: true }
    );
  return table.where(parent.field).anyOf([...parentIds]);
}
