import type { ReadModelRefreshMessage, ReadModelRefreshRequest } from '../workers/read-model.worker';
import { workerJob } from './worker-job';

let running: { cancel: () => void } | undefined;

/**
 * Starts bringing the stored read model up to date in a background worker (workers/read-model.worker.ts), after
 * a write of many studies. Nothing waits for it and nothing depends on it: a page that ranks before it ends
 * reads the studies itself, as it would have anyway. A refresh still running is replaced by the new one.
 */
export function refreshReadModel(databaseName: string): void {
  running?.cancel();
  const job = workerJob<ReadModelRefreshRequest, ReadModelRefreshMessage, string>(
    () => new Worker(new URL('../workers/read-model.worker.ts', import.meta.url), { type: 'module' }),
    { databaseName },
    (m) => (m.type === 'done' ? { result: m.source } : { refused: m.message }),
    { failed: 'The portfolio summary could not be refreshed', cancelled: 'Refresh cancelled' }
  );
  running = job;
  job.done
    .then(
      () => undefined,
      () => undefined
    )
    .finally(() => {
      if (running === job) running = undefined;
    });
}
