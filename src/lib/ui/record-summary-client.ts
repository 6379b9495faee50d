import type { DatabaseSummary } from '../storage/portfolio-overview';
import type { RecordSummaryMessage, RecordSummaryRequest } from '../workers/record-summary.worker';
import { workerJob } from './worker-job';

/** Counts the records on this device in a worker of its own (workers/record-summary.worker.ts). */
export function summariseInWorker(databaseName: string): {
  done: Promise<DatabaseSummary>;
  cancel: () => void;
} {
  return workerJob<RecordSummaryRequest, RecordSummaryMessage, DatabaseSummary>(
    () => new Worker(new URL('../workers/record-summary.worker.ts', import.meta.url), { type: 'module' }),
    { databaseName },
    (m) => (m.type === 'done' ? { result: m.summary } : { refused: m.message }),
    { failed: 'The records could not be counted', cancelled: 'Counting cancelled' }
  );
}
