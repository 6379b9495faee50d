import { RECORD_KINDS, type RecordKind } from '../domain/record-kinds';

/** A table that holds synchronised records (not device settings). */
export type RecordTableName = Exclude<RecordKind, 'studies'> | 'studyShelves';

/** The table that holds a kind's records: its own name, but studies are on shelves (study-shelf.ts). */
export function tableNameOf(kind: RecordKind): RecordTableName {
  return kind === 'studies' ? 'studyShelves' : kind;
}

/** Every table of synchronised records, each stamped with `localSeq` (local-sequence.ts). */
export const RECORD_TABLES: readonly RecordTableName[] = RECORD_KINDS.map(tableNameOf);
