import type { FolderSyncReport, SyncDirectory } from '../exchange/folder-sync';
import type { FolderSyncState } from '../storage/folder-sync-state';
import type { CapstanStorage } from '../storage/storage';
import { exportInWorker, receiveInWorker } from './exchange-worker-client';
import { refreshReadModel } from './device-reader-client';

/**
 * The page side of syncing through a shared folder (exchange/folder-sync.ts): choosing the folder, keeping its
 * permission, and syncing at start, every few minutes while online, and on demand. Held by the app state, so
 * one sync runs per tab; a Web Lock keeps two tabs of one device from syncing at the same moment.
 */

/** Chromium's File System Access API, which TypeScript's DOM types do not describe yet. */
interface FolderPickerWindow {
  showDirectoryPicker?: (options?: { id?: string; mode?: 'read' | 'readwrite' }) => Promise<unknown>;
}
interface PermissionHandle {
  queryPermission?: (options: { mode: 'readwrite' }) => Promise<PermissionState>;
  requestPermission?: (options: { mode: 'readwrite' }) => Promise<PermissionState>;
}
type FolderHandle = SyncDirectory & PermissionHandle;

/** Often enough that a site's month reaches the office the same morning; rare enough to cost nothing. */
export const SYNC_EVERY_MS = 5 * 60_000;

/** More studies than this merged in one sync: refresh the portfolio's stored summary in the background. */
const REFRESH_AFTER = 1000;

export function folderPickerAvailable(): boolean {
  return (
    typeof window !== 'undefined' && typeof (window as FolderPickerWindow).showDirectoryPicker === 'function'
  );
}

const messageOf = (error: unknown) => (error instanceof Error ? error.message : String(error));

export class FolderSyncController {
  folder = $state.raw<FolderHandle | undefined>(undefined);
  /** Whether this page may read and write the folder now; 'prompt' needs a click (browsers ask once a visit). */
  permission = $state<PermissionState | undefined>(undefined);
  state = $state.raw<FolderSyncState | undefined>(undefined);
  report = $state.raw<FolderSyncReport | undefined>(undefined);
  busy = $state<string | undefined>(undefined);
  failure = $state<string | undefined>(undefined);
  private timer: ReturnType<typeof setInterval> | undefined;

  constructor(private readonly storage: CapstanStorage) {}

  /** Loads the remembered folder and, where the browser still grants access, syncs at once. */
  async start(): Promise<void> {
    this.state = await this.storage.syncFolder.state();
    const handle = (await this.storage.syncFolder.handle()) as FolderHandle | undefined;
    if (handle) {
      this.folder = handle;
      this.permission = await this.query(handle);
      if (this.permission === 'granted') await this.sync();
    }
    this.timer = setInterval(() => {
      if (navigator.onLine) void this.sync();
    }, SYNC_EVERY_MS);
    window.addEventListener('online', this.onOnline);
  }

  stop(): void {
    clearInterval(this.timer);
    window.removeEventListener('online', this.onOnline);
  }

  private readonly onOnline = () => void this.sync();

  private async query(handle: FolderHandle): Promise<PermissionState> {
    // Handles without the method (the origin-private file system) are always granted.
    return handle.queryPermission ? handle.queryPermission({ mode: 'readwrite' }) : 'granted';
  }

  /** Opens the browser's folder picker; the folder chosen replaces any earlier one. */
  async choose(): Promise<void> {
    const picker = (window as FolderPickerWindow).showDirectoryPicker;
    if (!picker) return;
    this.failure = undefined;
    let handle: FolderHandle;
    try {
      handle = (await picker({ id: 'capstan-sync-folder', mode: 'readwrite' })) as FolderHandle;
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError') return;
      this.failure = `The folder could not be opened: ${messageOf(error)}`;
      return;
    }
    await this.storage.syncFolder.setHandle(undefined);
    await this.storage.syncFolder.setHandle(handle);
    this.folder = handle;
    this.permission = await this.query(handle);
    this.state = { files: {} };
    this.report = undefined;
    await this.sync();
  }

  /** Syncs now, asking the browser for access first when it wants a click for that. */
  async syncNow(): Promise<void> {
    const handle = this.folder;
    if (!handle) return;
    if (this.permission !== 'granted' && handle.requestPermission) {
      this.permission = await handle.requestPermission({ mode: 'readwrite' });
      if (this.permission !== 'granted') {
        this.failure = 'The browser did not allow access to the folder: nothing was synced.';
        return;
      }
    }
    await this.sync();
  }

  /** Stops using the folder on this device; the files in it are left as they are. */
  async forget(): Promise<void> {
    await this.storage.syncFolder.setHandle(undefined);
    this.folder = undefined;
    this.permission = undefined;
    this.state = { files: {} };
    this.report = undefined;
    this.failure = undefined;
  }

  /** A sync asked for while one runs (a merge just settled by hand): run once more when it ends. */
  private again = false;

  private async sync(): Promise<void> {
    const folder = this.folder;
    if (!folder || this.permission !== 'granted') return;
    if (this.busy !== undefined) {
      this.again = true;
      return;
    }
    const run = async () => {
      this.busy = 'Looking at the folder…';
      this.failure = undefined;
      try {
        const { syncWithFolder } = await import('../exchange/folder-sync');
        const report = await syncWithFolder({
          storage: this.storage,
          folder,
          appVersion: __APP_VERSION__,
          receive: (file) => receiveInWorker(this.storage, file, () => undefined).done,
          writeFile: (scope, identity, options) =>
            exportInWorker(this.storage, scope, identity, options, () => undefined).done,
          onStage: (text) => (this.busy = text)
        });
        this.report = report;
        this.state = report.state;
        const studies = report.merged.reduce(
          (n, f) => n + (f.counts ? f.counts.new + f.counts.updated + f.counts.deleted : 0),
          0
        );
        if (studies > REFRESH_AFTER) refreshReadModel(this.storage.databaseName);
      } catch (error) {
        if (error instanceof DOMException && error.name === 'NotAllowedError') this.permission = 'prompt';
        this.failure = `The sync folder could not be read or written (${messageOf(error)}). Nothing on this device was changed by the failed step; the next sync tries again.`;
      } finally {
        this.busy = undefined;
      }
    };
    const locks = typeof navigator !== 'undefined' ? navigator.locks : undefined;
    if (locks)
      await locks.request('capstan-folder-sync', { ifAvailable: true }, (lock) => (lock ? run() : undefined));
    else await run();
    if (this.again) {
      this.again = false;
      await this.sync();
    }
  }
}
