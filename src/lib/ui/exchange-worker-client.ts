import type { ChangeSet } from '../exchange/exchange-file';
import type { ExchangeWorkerMessage, ExchangeWorkerRequest } from '../workers/exchange-file.worker';

/** Words for the stages the exchange worker reports, for a status line. */
export const STAGE_LABEL: Record<string, string> = {
  reading: 'Reading the file…',
  unpacking: 'Unpacking…',
  parsing: 'Reading the records…',
  verifying: 'Checking the content hash and every record…',
  writing: 'Writing the file…'
};

/** Runs one request in a fresh worker; `cancel` stops it (nothing has been written anywhere). */
function run<T>(
  request: ExchangeWorkerRequest,
  onStage: (label: string) => void,
  pick: (m: ExchangeWorkerMessage) => T | undefined
): { done: Promise<T>; cancel: () => void } {
  const worker = new Worker(new URL('../workers/exchange-file.worker.ts', import.meta.url), {
    type: 'module'
  });
  let reject: (e: Error) => void = () => undefined;
  const done = new Promise<T>((resolve, rej) => {
    reject = rej;
    worker.onmessage = (event: MessageEvent<ExchangeWorkerMessage>) => {
      const m = event.data;
      if (m.type === 'stage') onStage(STAGE_LABEL[m.stage] ?? m.stage);
      else if (m.type === 'refused') {
        worker.terminate();
        rej(new Error(m.message));
      } else {
        const value = pick(m);
        if (value !== undefined) {
          worker.terminate();
          resolve(value);
        }
      }
    };
    worker.onerror = (event) => {
      worker.terminate();
      rej(new Error(`The file could not be processed: ${event.message || 'the background reader failed'}`));
    };
  });
  worker.postMessage(request);
  return {
    done,
    cancel: () => {
      worker.terminate();
      reject(new Error('Cancelled: nothing was imported'));
    }
  };
}

export function decodeInWorker(file: Blob, onStage: (label: string) => void) {
  return run<ChangeSet>({ type: 'decode', file }, onStage, (m) =>
    m.type === 'decoded' ? m.changeSet : undefined
  );
}

export function encodeInWorker(changeSet: ChangeSet, gzip: boolean, onStage: (label: string) => void) {
  return run<Uint8Array>({ type: 'encode', changeSet, gzip }, onStage, (m) =>
    m.type === 'encoded' ? m.bytes : undefined
  );
}
