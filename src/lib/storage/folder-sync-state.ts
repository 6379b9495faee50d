import type { MergeKind } from '../domain/record-merge';
import type { CapstanDatabase } from './database';

/**
 * What this device remembers of its shared sync folder (device-local, never exported): the folder's handle,
 * kept in its own setting because the browser stores it as an opaque object, and what the last syncs saw.
 */

/** One file of another device in the folder, as the last sync left it. */
export interface FolderFileSeen {
  name: string;
  /** Size and modification time: a file whose fingerprint is unchanged is not read again. */
  fingerprint: string;
  modifiedAt: string;
  deviceId?: string;
  deviceName?: string;
  exportedAt?: string;
  /** merged: in this device's data; waiting: holds conflicts a person must settle; skipped: could not be read. */
  outcome: 'merged' | 'waiting' | 'skipped';
  problem?: string;
  /** When it was merged here, and what that merge did. */
  mergedAt?: string;
  counts?: Record<MergeKind, number>;
  /** The write sequence this device had when the file was found waiting (unchanged: no need to look again). */
  seenAtMark?: number;
}

export interface FolderSyncState {
  folderName?: string;
  /** This device's own file in the folder, and the write sequence it holds. */
  ownFile?: string;
  writtenThrough?: number;
  ownWrittenAt?: string;
  lastSyncAt?: string;
  files: Record<string, FolderFileSeen>;
}

const HANDLE_KEY = 'syncFolderHandle';
const STATE_KEY = 'syncFolderState';

export async function loadFolderHandle(db: CapstanDatabase): Promise<unknown> {
  return (await db.deviceSettings.get(HANDLE_KEY))?.value;
}

/** Stores the handle (undefined: forget the folder, and what was seen in it). */
export async function saveFolderHandle(db: CapstanDatabase, handle: unknown): Promise<void> {
  await db.transaction('rw', db.deviceSettings, async () => {
    if (handle === undefined) {
      await db.deviceSettings.bulkDelete([HANDLE_KEY, STATE_KEY]);
      return;
    }
    await db.deviceSettings.put({ key: HANDLE_KEY, value: handle });
  });
}

export async function loadFolderSyncState(db: CapstanDatabase): Promise<FolderSyncState> {
  const value = (await db.deviceSettings.get(STATE_KEY))?.value as FolderSyncState | undefined;
  return value && typeof value === 'object' && value.files ? value : { files: {} };
}

export async function saveFolderSyncState(db: CapstanDatabase, state: FolderSyncState): Promise<void> {
  await db.deviceSettings.put({ key: STATE_KEY, value: state });
}
