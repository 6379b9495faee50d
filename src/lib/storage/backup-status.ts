import { RECORD_KINDS } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import type { Table } from 'dexie';
import type { CapstanDatabase } from './database';

/** Device setting holding when this device last exported and the write sequence it had reached. */
export const LAST_EXPORT_KEY = 'lastExport';

/** When this device last exported, and what has been written here since, for the backup reminder. */
export interface BackupStatus {
  lastExportAt?: string;
  /** Records written (typed or imported) on this device after its last export. */
  unexported: number;
  /** Write time (from the sequence) of the oldest of them. */
  oldestUnexportedAt?: string;
}

export async function loadBackupStatus(db: CapstanDatabase): Promise<BackupStatus> {
  const row = (await db.deviceSettings.get(LAST_EXPORT_KEY))?.value as
    { at: string; highWater: number } | undefined;
  const after = row?.highWater ?? 0;
  let unexported = 0;
  let oldest: number | undefined;
  for (const kind of RECORD_KINDS) {
    const range = (db.table(kind) as unknown as Table<RecordMeta, string>).where('localSeq').above(after);
    unexported += await range.count();
    const first = await range.first();
    if (first?.localSeq !== undefined && (oldest === undefined || first.localSeq < oldest))
      oldest = first.localSeq;
  }
  return {
    lastExportAt: row?.at,
    unexported,
    oldestUnexportedAt:
      oldest === undefined ? undefined : new Date(Math.min(oldest, Date.now())).toISOString()
  };
}
