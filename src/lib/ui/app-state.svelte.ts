import { getContext, setContext } from 'svelte';
import { openStorage, type CapstanStorage } from '../storage/storage';
import { readStorageHealth, requestPersistence, type StorageHealth } from '../storage/storage-health';
import type { FolderSyncController } from './folder-sync.svelte';

/**
 * What every page needs: the open storage (once it is open), this device's persistence status and the
 * network state. Created once by the root layout and handed down through context, never a module global.
 */
export class AppState {
  storage = $state.raw<CapstanStorage | undefined>(undefined);
  openError = $state.raw<string | undefined>(undefined);
  /** Set while an older tab keeps the database from upgrading; cleared once it opens. */
  blocked = $state.raw<string | undefined>(undefined);
  health = $state.raw<StorageHealth | undefined>(undefined);
  online = $state(true);
  /** Sync through a shared folder: started once storage is open (loaded then, off the first page's code). */
  folderSync = $state.raw<FolderSyncController | undefined>(undefined);

  async open(): Promise<void> {
    try {
      this.storage = await openStorage(undefined, undefined, { onBlocked: (m) => (this.blocked = m) });
      this.blocked = undefined;
    } catch (error) {
      this.openError = error instanceof Error ? error.message : String(error);
      return;
    }
    // Only a device that uses a sync folder loads its code at start; the File exchange page loads it too.
    if (await this.storage.syncFolder.handle()) void this.loadFolderSync();
    // Ask once per start; browsers remember a grant, and a refusal costs nothing.
    await requestPersistence().catch(() => undefined);
    await this.refreshHealth();
  }

  /** Creates (once) and starts the folder sync of this device. */
  async loadFolderSync(): Promise<FolderSyncController | undefined> {
    const storage = this.storage;
    if (!storage) return undefined;
    this.folderSyncLoading ??= import('./folder-sync.svelte').then(async ({ FolderSyncController }) => {
      const controller = new FolderSyncController(storage);
      await controller.start();
      this.folderSync = controller;
      return controller;
    });
    return this.folderSyncLoading;
  }
  private folderSyncLoading: Promise<FolderSyncController> | undefined;

  async refreshHealth(): Promise<void> {
    this.health = await readStorageHealth();
  }

  async askForPersistence(): Promise<void> {
    await requestPersistence();
    await this.refreshHealth();
  }
}

const KEY = Symbol('capstan-app-state');

export function provideAppState(state: AppState): AppState {
  return setContext(KEY, state);
}

export function useAppState(): AppState {
  const state = getContext<AppState | undefined>(KEY);
  if (!state) throw new Error('useAppState must be called below the root layout');
  return state;
}
