import type { Table } from 'dexie';
import type { RecordKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import type { Study } from '../domain/study';
import type { CapstanDatabase } from './database';
import { tableNameOf } from './record-tables';
import { partsOf, writePipelined } from './pipelined-write';
import { allStudies, putStudies, studiesChangedSince } from './study-shelves';

/**
 * Reading and writing any kind of synchronised record, for the code that handles every kind alike (the exchange,
 * the cascade of a deletion): studies through their shelves (study-shelves.ts), the rest through their table.
 */

type AnyTable = Table<RecordMeta, string>;

/** The Dexie table of a kind that is not studies (those are on shelves). */
export function plainTableOf(db: CapstanDatabase, kind: Exclude<RecordKind, 'studies'>): AnyTable {
  return db.table(kind) as unknown as AnyTable;
}

/** The Dexie tables a transaction over these kinds must hold. */
export function tablesOfKinds(db: CapstanDatabase, kinds: readonly RecordKind[]): Table[] {
  return kinds.map((k) => db.table(tableNameOf(k)));
}

/** Every record of a kind, live and deleted. */
export async function allOfKind(db: CapstanDatabase, kind: RecordKind): Promise<RecordMeta[]> {
  return kind === 'studies' ? allStudies(db) : plainTableOf(db, kind).toArray();
}

/** Records of a kind written on this device after `seq`. */
export async function changedSince(
  db: CapstanDatabase,
  kind: RecordKind,
  seq: number
): Promise<RecordMeta[]> {
  return kind === 'studies'
    ? studiesChangedSince(db, seq)
    : plainTableOf(db, kind).where('localSeq').above(seq).toArray();
}

/**
 * Records of a plain kind written per request (see putOfKind): 1 000 made each request a task of 100–150 ms on the
 * page's thread (22 of them for a 72 000-study file, before studies were shelved); 250 keep each well under 50
 * ms, in the same total time, and are more than the 50 below which Dexie notes every key written.
 */
const RECORDS_PER_PUT = 250;

/**
 * Writes whole versions of records of one kind, in parts written two at a time (pipelined-write.ts); `onWritten`
 * hears how many records each part held, once it is written.
 */
export async function putOfKind(
  db: CapstanDatabase,
  kind: RecordKind,
  records: readonly RecordMeta[],
  onWritten?: (count: number) => void
): Promise<void> {
  if (kind === 'studies') return putStudies(db, records as Study[], onWritten);
  const table = plainTableOf(db, kind);
  await writePipelined(partsOf(records, RECORDS_PER_PUT), (rows) => table.bulkPut(rows), onWritten);
}
