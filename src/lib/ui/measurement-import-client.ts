import type { ImportMessage, ImportRequest } from '../workers/measurement-import.worker';
import { workerJob } from './worker-job';

export type ImportRead = Extract<ImportMessage, { type: 'done' }>;

/**
 * Reads a measurement file in a fresh worker (the same shape as the exchange worker client): progress as it
 * goes, the groups read at the end; `cancel` stops the worker, and nothing has been written anywhere.
 */
export function readMeasurementsInWorker(
  request: ImportRequest,
  onProgress: (fraction: number, rows: number) => void
): { done: Promise<ImportRead>; cancel: () => void } {
  return workerJob<ImportRequest, ImportMessage, ImportRead>(
    () => new Worker(new URL('../workers/measurement-import.worker.ts', import.meta.url), { type: 'module' }),
    request,
    (m) => {
      if (m.type === 'progress') {
        onProgress(m.fraction, m.rows);
        return undefined;
      }
      return m.type === 'error' ? { refused: m.message } : { result: m };
    },
    { failed: 'Reading stopped', cancelled: 'Reading cancelled. Nothing was imported.' }
  );
}
