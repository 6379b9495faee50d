/** What the browser says about this origin's storage. */
export interface StorageHealth {
  /** true: the browser promised not to evict our data under storage pressure. undefined: not supported. */
  persisted: boolean | undefined;
  usageBytes: number | undefined;
  quotaBytes: number | undefined;
}

/**
 * Asks for persistent storage once (browsers may grant it silently, ask the user, or refuse) and reads the
 * estimate of use and quota. Without persistence, a browser under disk pressure may delete everything.
 */
export async function requestPersistence(): Promise<boolean | undefined> {
  if (typeof navigator === 'undefined' || !navigator.storage?.persist) return undefined;
  if (await navigator.storage.persisted()) return true;
  return navigator.storage.persist();
}

export async function readStorageHealth(): Promise<StorageHealth> {
  if (typeof navigator === 'undefined' || !navigator.storage) {
    return { persisted: undefined, usageBytes: undefined, quotaBytes: undefined };
  }
  const persisted = navigator.storage.persisted ? await navigator.storage.persisted() : undefined;
  const estimate = navigator.storage.estimate ? await navigator.storage.estimate() : {};
  return { persisted, usageBytes: estimate.usage, quotaBytes: estimate.quota };
}
