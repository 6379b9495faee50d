import { observe } from '../storage/live-observer';

/** The latest result of a live storage query, as reactive state. */
export class LiveValue<T> {
  current = $state.raw<T | undefined>(undefined);
  error = $state.raw<string | undefined>(undefined);
  loading = $state(true);
}

/**
 * Keeps a LiveValue up to date. `makeQuery` is read inside an effect, so Svelte state it touches (a chosen
 * site, a period) re-creates the query; the query itself re-runs whenever the tables it read change,
 * in this tab or another. Returning undefined means "not ready" (storage still opening).
 */
export function liveValue<T>(makeQuery: () => (() => Promise<T>) | undefined): LiveValue<T> {
  const value = new LiveValue<T>();
  $effect(() => {
    const query = makeQuery();
    if (!query) return;
    value.loading = true;
    return observe(
      query,
      (result) => {
        value.current = result;
        value.error = undefined;
        value.loading = false;
      },
      (error) => {
        value.error = error instanceof Error ? error.message : String(error);
        value.loading = false;
      }
    );
  });
  return value;
}
