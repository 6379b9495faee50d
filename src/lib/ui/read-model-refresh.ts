import type { DeviceReaderMessage, DeviceReaderRequest } from '../workers/device-reader.worker';
import { workerJob } from './worker-job';

let running: { cancel: () => void } | undefined;

/**
 * Starts bringing the stored read model up to date in a background worker (workers/device-reader.worker.ts), after
 * a write of many studies. Nothing waits for it and nothing depends on it: a page that ranks before it ends
 * reads the studies itself, as it would have anyway. A refresh still running is replaced by the new one.
 */
export function refreshReadModel(databaseName: string): void {
  running?.cancel();
  const job = workerJob<DeviceReaderRequest, DeviceReaderMessage, string>(
    () => new Worker(new URL('../workers/device-reader.worker.ts', import.meta.url), { type: 'module' }),
    { job: 'refresh-read-model', databaseName },
    (m) =>
      m.type === 'refreshed'
        ? { result: m.source }
        : m.type === 'refused'
          ? { refused: m.message }
          : undefined,
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
