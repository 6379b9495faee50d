import type { MasterListMessage, MasterListRequest } from '../workers/master-list.worker';
import { workerJob } from './worker-job';

export type MasterListRead = Extract<MasterListMessage, { type: 'done' }>;

/**
 * Reads and checks a master list in a fresh worker: progress as it goes, the plan at the end; `cancel` stops
 * the worker, and nothing has been written anywhere.
 */
export function planMasterListInWorker(
  request: MasterListRequest,
  onProgress: (fraction: number, words: string) => void
): { done: Promise<MasterListRead>; cancel: () => void } {
  return workerJob<MasterListRequest, MasterListMessage, MasterListRead>(
    () => new Worker(new URL('../workers/master-list.worker.ts', import.meta.url), { type: 'module' }),
    request,
    (m) => {
      if (m.type === 'progress') {
        onProgress(m.fraction, m.words);
        return undefined;
      }
      return m.type === 'error' ? { refused: m.message } : { result: m };
    },
    { failed: 'Checking stopped', cancelled: 'Checking cancelled. Nothing was imported.' }
  );
}
