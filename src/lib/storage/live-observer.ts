import { liveQuery } from 'dexie';

/**
 * Runs `query` now and again whenever the tables it read change — in this tab or another one of the same
 * origin. Returns the function that stops observing. The UI calls this rather than Dexie itself.
 */
export function observe<T>(
  query: () => Promise<T>,
  onValue: (value: T) => void,
  onError: (error: unknown) => void
): () => void {
  const subscription = liveQuery(query).subscribe({ next: onValue, error: onError });
  return () => subscription.unsubscribe();
}
