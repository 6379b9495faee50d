import { PARENT_OF, type RecordKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import type { CapstanDatabase } from './database';
import { studiesUnder } from './study-shelves';

/**
 * Every record of a kind (live or not) whose parent is one of `parentIds`: the one query by parent, so that the
 * way each kind is found is chosen in one place. Studies are the shelves of their characteristics
 * (study-shelves.ts); the others are found by their parent's index. Runs inside the caller's transaction, if any.
 */
export async function recordsUnder(
  db: CapstanDatabase,
  kind: RecordKind,
  parentIds: readonly string[]
): Promise<RecordMeta[]> {
  const parent = PARENT_OF[kind];
  if (!parent) throw new Error(`${kind} records have no parent`);
  if (kind === 'studies') return studiesUnder(db, parentIds);
  return db
    .table<RecordMeta, string>(kind)
    .where(parent.field)
    .anyOf([...parentIds])
    .toArray();
}
