import type { DatabaseSummary } from '../storage/portfolio-overview';
import type { DeviceReaderMessage, DeviceReaderRequest } from '../workers/device-reader.worker';
import { workerJob } from './worker-job';

type Answer = Exclude<DeviceReaderMessage, { type: 'refused' }>;

/** One background read of this device's records in a fresh worker (workers/device-reader.worker.ts). */
function deviceReaderJob<T>(
  request: DeviceReaderRequest,
  pick: (answer: Answer) => T | undefined,
  words: { failed: string; cancelled: string }
): { done: Promise<T>; cancel: () => void } {
  return workerJob<DeviceReaderRequest, DeviceReaderMessage, T>(
    () => new Worker(new URL('../workers/device-reader.worker.ts', import.meta.url), { type: 'module' }),
    request,
    (m) => {
      if (m.type === 'refused') return { refused: m.message };
      const value = pick(m);
      return value === undefined ? undefined : { result: value };
    },
    words
  );
}

let refreshing: { cancel: () => void } | undefined;

/**
 * Starts bringing the stored read model up to date in the background, after a write of many studies. Nothing
 * waits for it and nothing depends on it: a page that ranks before it ends reads the studies itself, as it would
 * have anyway. A refresh still running is replaced by the new one.
 */
export function refreshReadModel(databaseName: string): void {
  refreshing?.cancel();
  const job = deviceReaderJob(
    { job: 'refresh-read-model', databaseName },
    (m) => (m.type === 'refreshed' ? m.source : undefined),
    { failed: 'The portfolio summary could not be refreshed', cancelled: 'Refresh cancelled' }
  );
  refreshing = job;
  job.done
    .then(
      () => undefined,
      () => undefined
    )
    .finally(() => {
      if (refreshing === job) refreshing = undefined;
    });
}

/** Counts the records on this device (it reads every study) in the background. */
export function summariseInWorker(databaseName: string): {
  done: Promise<DatabaseSummary>;
  cancel: () => void;
} {
  return deviceReaderJob(
    { job: 'count-records', databaseName },
    (m) => (m.type === 'counted' ? m.summary : undefined),
    { failed: 'The records could not be counted', cancelled: 'Counting cancelled' }
  );
}
