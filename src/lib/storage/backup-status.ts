import { RECORD_KINDS } from '../domain/record-kinds';
import type { CapstanDatabase } from './database';
import { plainTableOf } from './records-of-kind';
import { unsentStudies } from './study-shelves';

/** Device setting holding when this device last exported and the write sequence it had reached. */
export const LAST_EXPORT_KEY = 'lastExport';

/** When this device last exported, and what has been written here since, for the backup reminder. */
export interface BackupStatus {
  lastExportAt?: string;
  /** Records written (typed or imported) on this device after its last export. */
  unexported: number;
  /**
   * `unexported` is a lower bound: studies of more characteristics than are counted one by one were written
   * since (a company's file merged here writes thousands; storage/study-shelves.ts unsentStudies), each counted
   * once, and the oldest is that of the characteristic written least recently.
   */
  atLeast: boolean;
  /** Write time (from the sequence) of the oldest of them. */
  oldestUnexportedAt?: string;
}

export async function loadBackupStatus(db: CapstanDatabase): Promise<BackupStatus> {
  const row = (await db.deviceSettings.get(LAST_EXPORT_KEY))?.value as
    { at: string; highWater: number } | undefined;
  const after = row?.highWater ?? 0;
  let unexported = 0;
  let oldest: number | undefined;
  let atLeast = false;
  const counted = (count: number, first: number | undefined) => {
    unexported += count;
    if (first !== undefined && (oldest === undefined || first < oldest)) oldest = first;
  };
  for (const kind of RECORD_KINDS) {
    if (kind === 'studies') {
      const studies = await unsentStudies(db, after);
      counted(studies.count, studies.oldest);
      atLeast = studies.atLeast;
      continue;
    }
    const range = plainTableOf(db, kind).where('localSeq').above(after);
    counted(await range.count(), (await range.first())?.localSeq);
  }
  return {
    lastExportAt: row?.at,
    unexported,
    atLeast,
    oldestUnexportedAt:
      oldest === undefined ? undefined : new Date(Math.min(oldest, Date.now())).toISOString()
  };
}
