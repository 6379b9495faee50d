import type { MergeKind } from '../domain/record-merge';
import type { FolderFileSeen, FolderSyncState } from '../storage/folder-sync-state';
import type { CapstanStorage } from '../storage/storage';
import { decodeExchangeFile } from './exchange-file';
import {
  rememberExport,
  writeExport,
  type ExportedFile,
  type ExportIdentity,
  type ExportOptions,
  type ExportScope
} from './export-change-set';
import { receiveChangeSet, type ReceiveSession } from './receive-session';
import { deviceFileName, exchangeNamesIn, unfinishedNameOf } from './folder-names';

/**
 * Sync through a shared folder that the company's file-sync service (a synced drive, a shared network folder)
 * carries between devices. The folder is only a transport: each device writes one file of its own, and reads
 * and merges the others' files with the same preview and merge rules as a file received by hand.
 *
 * What each device writes: everything it holds (live records and deletion markers), as the "everything"
 * export does. So any one file brings a new device up to date, and no record depends on one device's file
 * staying in the folder; the price is that each file is the size of the whole portfolio (gzip-compressed).
 * It is rewritten only when something was written on this device (typed or merged) since the last time.
 *
 * The seam is a directory handle: in the browser one from the folder picker (File System Access API), in
 * tests one from the origin-private file system, or any object with the same few methods.
 */

/** The parts of a directory handle this module uses (FileSystemDirectoryHandle has them all). */
export interface SyncDirectory {
  readonly name: string;
  values(): AsyncIterable<{ readonly kind: 'file' | 'directory'; readonly name: string }>;
  getFileHandle(name: string, options?: { create?: boolean }): Promise<SyncFileHandle>;
  removeEntry(name: string): Promise<void>;
}

export interface SyncFileHandle {
  readonly name: string;
  getFile(): Promise<Blob & { readonly lastModified: number }>;
  createWritable(): Promise<{ write(data: Uint8Array | Blob): Promise<void>; close(): Promise<void> }>;
  /** Renames in place (Chromium; in the origin-private file system and for picked folders). */
  move?(newName: string): Promise<void>;
}

export interface FolderSyncOptions {
  storage: CapstanStorage;
  folder: SyncDirectory;
  appVersion: string;
  /**
   * Reads a file and compares it with this device (the page passes its worker, which also merges; without it,
   * both run in the caller's thread).
   */
  receive?: (file: Blob) => Promise<ReceiveSession>;
  /**
   * Collects and writes a file as writeExport does (the page passes its worker, exportInWorker; without it, both
   * run in the caller's thread). This device's file is remembered here once it is in the folder.
   */
  writeFile?: (scope: ExportScope, identity: ExportIdentity, options: ExportOptions) => Promise<ExportedFile>;
  now?: () => Date;
  onStage?: (text: string) => void;
}

export interface FolderSyncReport {
  state: FolderSyncState;
  /** Whether this device's file was (re)written in this sync. */
  wrote: boolean;
  merged: FolderFileSeen[];
  waiting: FolderFileSeen[];
  skipped: FolderFileSeen[];
}

/**
 * Writes a file (its bytes, or a Blob of them) under a hidden temporary name, then renames it into place, so the
 * sync service never carries half a file. Where renaming is not offered, the file is written in place (Chromium
 * still swaps a complete file in when the writer closes) and the temporary copy removed.
 */
export async function writeFileAtomically(
  folder: SyncDirectory,
  name: string,
  content: Uint8Array | Blob
): Promise<void> {
  const partName = unfinishedNameOf(name);
  const part = await folder.getFileHandle(partName, { create: true });
  const writer = await part.createWritable();
  await writer.write(content);
  await writer.close();
  if (part.move) {
    try {
      await part.move(name);
      return;
    } catch {
      // Some folders refuse renaming: fall back to writing in place.
    }
  }
  const final = await folder.getFileHandle(name, { create: true });
  const finalWriter = await final.createWritable();
  await finalWriter.write(content);
  await finalWriter.close();
  await folder.removeEntry(partName).catch(() => undefined);
}

const noChange = (c: Record<MergeKind, number>) => c.new + c.updated + c.deleted === 0;

/** This device's own file in the folder: everything it holds, compressed. */
const OWN_FILE: { scope: ExportScope; options: ExportOptions } = {
  scope: { kind: 'everything' },
  options: { gzip: true }
};

/** One sync: read and merge what other devices wrote, then write this device's file if it changed. */
export async function syncWithFolder(options: FolderSyncOptions): Promise<FolderSyncReport> {
  const { storage, folder } = options;
  const now = options.now ?? (() => new Date());
  const receive =
    options.receive ??
    (async (file: Blob) =>
      receiveChangeSet(storage, await decodeExchangeFile(new Uint8Array(await file.arrayBuffer()))));
  const writeFile =
    options.writeFile ??
    ((scope: ExportScope, identity: ExportIdentity, o: ExportOptions) =>
      writeExport(storage, scope, identity, o));
  const stage = options.onStage ?? (() => undefined);

  const previous = await storage.syncFolder.state();
  const ownFile = deviceFileName(await storage.deviceName(), storage.deviceId);
  const fileNames: string[] = [];
  for await (const entry of folder.values()) if (entry.kind === 'file') fileNames.push(entry.name);
  const names = exchangeNamesIn(fileNames);

  const files: Record<string, FolderFileSeen> = {};
  const report: FolderSyncReport = { state: previous, wrote: false, merged: [], waiting: [], skipped: [] };
  for (const name of names) {
    if (name === ownFile) continue;
    let file: Blob & { lastModified: number };
    try {
      file = await (await folder.getFileHandle(name)).getFile();
    } catch {
      continue; // Removed (or renamed by the sync service) since the listing: the next sync sees what is there.
    }
    const fingerprint = `${file.size}:${file.lastModified}`;
    const modifiedAt = new Date(file.lastModified).toISOString();
    const before = previous.files[name];
    const mark = storage.syncFolder.writeMark();
    if (before?.fingerprint === fingerprint && (before.outcome !== 'waiting' || before.seenAtMark === mark)) {
      files[name] = before;
      if (before.outcome === 'waiting') report.waiting.push(before);
      continue;
    }
    let seen: FolderFileSeen;
    let read = false;
    let session: ReceiveSession | undefined;
    try {
      stage(`Reading ${name} and comparing it with the records on this device…`);
      session = await receive(file);
      read = true;
      const plan = session.preview;
      const header = plan.header;
      const about = {
        name,
        fingerprint,
        modifiedAt,
        deviceId: header.exportedBy.deviceId,
        deviceName: header.exportedBy.deviceName,
        exportedAt: header.exportedAt
      };
      if (plan.conflicts.length > 0) {
        seen = { ...about, outcome: 'waiting', counts: plan.counts, seenAtMark: mark };
        report.waiting.push(seen);
      } else {
        const at = now().toISOString();
        if (!noChange(plan.counts)) {
          stage(`Merging ${name}…`);
          await session.merge(
            {},
            { deviceId: header.exportedBy.deviceId, name: header.exportedBy.deviceName, at }
          );
        }
        seen = { ...about, outcome: 'merged', mergedAt: at, counts: plan.counts };
        report.merged.push(seen);
      }
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      seen = {
        name,
        // A damaged file (or one this device refuses to compare) is read again only once it changes; one that
        // could not be merged (the data here changed meanwhile, storage was full) is tried again at the next sync.
        fingerprint: read ? '' : fingerprint,
        modifiedAt,
        outcome: 'skipped',
        problem: read ? `could not be merged: ${message}` : message
      };
      report.skipped.push(seen);
    } finally {
      // A file left waiting for a person, or with nothing to merge, lets go of its worker.
      session?.close();
    }
    files[name] = seen;
  }

  // This device's own file: rewritten when anything was written here since, or when it is missing.
  const state: FolderSyncState = { ...previous, folderName: folder.name, files };
  const mark = storage.syncFolder.writeMark();
  if (!names.includes(ownFile) || previous.ownFile !== ownFile || (previous.writtenThrough ?? -1) < mark) {
    stage('Writing this device’s file…');
    const at = now().toISOString();
    const identity = {
      appVersion: options.appVersion,
      deviceName: await storage.deviceName(),
      exportedAt: at
    };
    const file = await writeFile(OWN_FILE.scope, identity, OWN_FILE.options);
    // The Blob the export worker made, where there is one: written from it, the file is not copied on the page's
    // thread first (a copy of the bytes held the page for tens of milliseconds at company size when downloaded).
    await writeFileAtomically(folder, ownFile, file.blob ?? file.bytes);
    await rememberExport(storage, file, OWN_FILE.scope, identity, OWN_FILE.options);
    if (previous.ownFile && previous.ownFile !== ownFile) {
      // The device was renamed: its old file would only repeat what the new one holds.
      await folder.removeEntry(previous.ownFile).catch(() => undefined);
    }
    state.ownFile = ownFile;
    state.writtenThrough = mark;
    state.ownWrittenAt = at;
    report.wrote = true;
  }
  state.lastSyncAt = now().toISOString();
  await storage.syncFolder.saveState(state);
  report.state = state;
  return report;
}
