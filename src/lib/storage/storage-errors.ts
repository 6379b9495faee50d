import { CURRENT_SCHEMA_VERSION } from './schema-versions';

/**
 * What went wrong with the database, said so that a person knows what happened to their data and what to do.
 * Every message says whether anything was written; IndexedDB transactions roll back as a whole, so a failed
 * write never leaves half of itself behind.
 */
export class StorageProblem extends Error {
  constructor(
    message: string,
    readonly kind: 'full' | 'newer-version' | 'blocked' | 'other',
    options?: { cause?: unknown }
  ) {
    super(message, options);
    this.name = 'StorageProblem';
  }
}

function names(error: unknown): string[] {
  const out: string[] = [];
  for (let e: unknown = error, depth = 0; e && depth < 5; depth++) {
    const x = e as { name?: unknown; inner?: unknown; cause?: unknown };
    if (typeof x.name === 'string') out.push(x.name);
    e = x.inner ?? x.cause;
  }
  return out;
}

/** A storage error in plain words, for any write (save, import, demo load); other errors pass through. */
export function explainStorageError(error: unknown, action = 'The change'): unknown {
  const n = names(error);
  if (n.includes('QuotaExceededError')) {
    return new StorageProblem(
      `${action} was not saved: this device's storage for Capstan is full, and nothing of it was written. Free space ` +
        '(Settings shows use and quota), or save a file of everything and remove old data, then try again.',
      'full',
      { cause: error }
    );
  }
  return error;
}

/** Why the database could not be opened, in plain words. */
export function explainOpenError(error: unknown): StorageProblem {
  const n = names(error);
  if (n.includes('VersionError')) {
    return new StorageProblem(
      `The data on this device was written by a newer version of Capstan than this one (which reads schema ` +
        `version ${CURRENT_SCHEMA_VERSION} and older). Nothing was changed. Reload while online to get the newer ` +
        'app, or open Capstan in the browser where it was updated.',
      'newer-version',
      { cause: error }
    );
  }
  if (n.includes('QuotaExceededError')) {
    return explainStorageError(error, 'Opening the database') as StorageProblem;
  }
  const detail = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
  return new StorageProblem(`The database could not be opened (${detail}). Nothing was changed.`, 'other', {
    cause: error
  });
}

export const BLOCKED_MESSAGE =
  'Another Capstan tab or window still holds the older version of the database, so this one cannot upgrade it ' +
  'yet. Close the other tab (or reload it); this tab carries on by itself as soon as it is closed. Nothing was changed.';
