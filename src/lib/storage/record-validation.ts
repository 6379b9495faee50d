/**
 * How a write checks its input: the parse of the record kind's schema (throws ValidationError) and every field
 * that schema knows. The schemas are built with zod, which pages that only read need not load; each kind's
 * validation is fetched on its first write (and precached for offline use like every other chunk).
 *
 * Load it before a Dexie transaction starts: waiting on anything but the database inside one ends it early.
 */
export interface RecordValidation<F> {
  /** Validates unknown input into the editable fields; throws ValidationError (domain/validation-error.ts). */
  parse: (input: unknown) => F;
  /**
   * Every field the schema knows (its shape's keys). An edit replaces these whole — a field left out is cleared —
   * while fields a newer version added stay as they were.
   */
  fields: readonly string[];
}

export type ValidationLoader<F> = () => Promise<RecordValidation<F>>;

/**
 * A loader that fetches once and then answers at once. A failed fetch (the network gone before the app was
 * stored for offline use) is said in words — nothing was written — and tried again on the next write.
 */
export function lazyValidation<F>(load: () => Promise<RecordValidation<F>>): ValidationLoader<F> {
  let pending: Promise<RecordValidation<F>> | undefined;
  return () =>
    (pending ??= load().catch((error: unknown) => {
      pending = undefined;
      throw new Error(
        'Nothing was saved: the checks for this record could not be loaded (the network was lost before Capstan ' +
          'was stored for offline use). Reload the page once online, then save again.',
        { cause: error }
      );
    }));
}
