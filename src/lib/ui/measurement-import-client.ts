import type { ImportMessage, ImportRequest } from '../workers/measurement-import.worker';

export type ImportRead = Extract<ImportMessage, { type: 'done' }>;

/**
 * Reads a measurement file in a fresh worker (the same shape as the exchange worker client): progress as it
 * goes, the groups read at the end; `cancel` stops the worker, and nothing has been written anywhere.
 */
export function readMeasurementsInWorker(
  request: ImportRequest,
  onProgress: (fraction: number, rows: number) => void
): { done: Promise<ImportRead>; cancel: () => void } {
  const worker = new Worker(new URL('../workers/measurement-import.worker.ts', import.meta.url), {
    type: 'module'
  });
  let reject: (e: Error) => void = () => undefined;
  const done = new Promise<ImportRead>((resolve, rej) => {
    reject = rej;
    worker.onmessage = (event: MessageEvent<ImportMessage>) => {
      const m = event.data;
      if (m.type === 'progress') onProgress(m.fraction, m.rows);
      else {
        worker.terminate();
        if (m.type === 'error') rej(new Error(m.message));
        else resolve(m);
      }
    };
    worker.onerror = (event) => {
      worker.terminate();
      rej(new Error(`Reading stopped: ${event.message || 'the background reader failed'}`));
    };
  });
  worker.postMessage(request);
  return {
    done,
    cancel: () => {
      worker.terminate();
      reject(new Error('Reading cancelled. Nothing was imported.'));
    }
  };
}
