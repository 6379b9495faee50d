import type { DatabaseSummary } from '../storage/portfolio-overview';
import type { DeviceReaderMessage, DeviceReaderRequest } from '../workers/device-reader.worker';
import { workerJob } from './worker-job';

/** Counts the records on this device in a worker of its own (workers/device-reader.worker.ts). */
export function summariseInWorker(databaseName: string): {
  done: Promise<DatabaseSummary>;
  cancel: () => void;
} {
  return workerJob<DeviceReaderRequest, DeviceReaderMessage, DatabaseSummary>(
    () => new Worker(new URL('../workers/device-reader.worker.ts', import.meta.url), { type: 'module' }),
    { job: 'count-records', databaseName },
    (m) =>
      m.type === 'counted'
        ? { result: m.summary }
        : m.type === 'refused'
          ? { refused: m.message }
          : undefined,
    { failed: 'The records could not be counted', cancelled: 'Counting cancelled' }
  );
}
