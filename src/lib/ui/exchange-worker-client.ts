import type { ExportedFile, ExportIdentity, ExportOptions, ExportScope } from '../exchange/export-change-set';
import type { ReceiveSession } from '../exchange/receive-session';
import type { CapstanStorage } from '../storage/storage';
import type {
  ExchangeWorkerMessage,
  ExchangeWorkerRequest,
  ExchangeWorkerStage
} from '../workers/exchange-file.worker';
import { workerJob } from './worker-job';

/** Words for the stages the exchange worker reports, for a status line. */
export const STAGE_LABEL: Record<ExchangeWorkerStage, string> = {
  reading: 'Reading the file…',
  unpacking: 'Unpacking…',
  parsing: 'Reading the records…',
  verifying: 'Checking the content hash and every record…',
  comparing: 'Comparing with the records on this device…',
  collecting: 'Collecting records…',
  writing: 'Writing the file…'
};

function startExchangeWorker(): Worker {
  return new Worker(new URL('../workers/exchange-file.worker.ts', import.meta.url), { type: 'module' });
}

/**
 * A receiving worker started before a file is chosen (warmReceiveWorker): starting one — fetching and compiling
 * its code, the schema library and storage — took 0.5 s of a 2 000-process file's 3.9 s to its preview in
 * Chromium (measured 2026-12-04 with timestamps on the page and in the worker), time the person then waits for.
 */
let warm: Worker | undefined;

/** Starts a receiving worker now, if none is waiting, so that the next file received does not wait for one. */
export function warmReceiveWorker(): void {
  warm ??= startExchangeWorker();
}

/** Lets go of the waiting worker (the page that asked for it is gone). */
export function releaseReceiveWorker(): void {
  warm?.terminate();
  warm = undefined;
}

/** The waiting worker, else a new one; either way no other file will be given it. */
function receivingWorker(): Worker {
  const worker = warm ?? startExchangeWorker();
  warm = undefined;
  return worker;
}

/** Runs one request that writes a file in a fresh worker (worker-job.ts), reporting its stages. */
function run<T>(
  request: ExchangeWorkerRequest,
  onStage: (label: string) => void,
  pick: (m: ExchangeWorkerMessage) => T | undefined
): { done: Promise<T>; cancel: () => void } {
  return workerJob<ExchangeWorkerRequest, ExchangeWorkerMessage, T>(
    startExchangeWorker,
    request,
    (m) => {
      if (m.type === 'stage') {
        onStage(STAGE_LABEL[m.stage]);
        return undefined;
      }
      if (m.type === 'refused') return { refused: m.message };
      const value = pick(m);
      return value === undefined ? undefined : { result: value };
    },
    { failed: 'The file could not be written', cancelled: 'Cancelled: no file was saved' }
  );
}

/**
 * Reads a received file in a worker of its own (started now, or waiting since warmReceiveWorker) and compares it with this device (workers/exchange-file.worker.ts):
 * `done` gives the session once the preview is ready, whose `merge` writes the file in the same worker. The page
 * holds the preview only. `cancel` (while reading) and the session's `close` terminate the worker; nothing has
 * been written then. After a merge the page's storage carries on above the worker's clock and write sequence.
 */
export function receiveInWorker(
  storage: CapstanStorage,
  file: Blob,
  onStage: (label: string) => void
): { done: Promise<ReceiveSession>; cancel: () => void } {
  const worker = receivingWorker();
  let waiting: { resolve: (m: ExchangeWorkerMessage) => void; reject: (e: Error) => void } | undefined;
  let onWritten: ((written: number, total: number) => void) | undefined;
  let ended = false;
  let merging = false;
  const end = () => {
    ended = true;
    worker.terminate();
  };
  /** The next answer (previewed, merged) or refusal. */
  const answer = () =>
    new Promise<ExchangeWorkerMessage>((resolve, reject) => {
      if (ended) reject(new Error('This file was discarded: read it again to merge it'));
      else waiting = { resolve, reject };
    });
  const settle = (outcome: ExchangeWorkerMessage | Error) => {
    const w = waiting;
    waiting = undefined;
    if (outcome instanceof Error) w?.reject(outcome);
    else w?.resolve(outcome);
  };
  worker.onmessage = (event: MessageEvent<ExchangeWorkerMessage>) => {
    const m = event.data;
    if (m.type === 'stage') onStage(STAGE_LABEL[m.stage]);
    else if (m.type === 'written') onWritten?.(m.written, m.total);
    // A refused merge leaves the worker with the file: the person can try again (storage full, say).
    else if (m.type === 'refused') settle(new Error(m.message));
    else settle(m);
  };
  worker.onerror = (event) => {
    end();
    settle(new Error(`The file could not be processed: ${event.message || 'the background reader failed'}`));
  };
  const previewed = answer();
  worker.postMessage({
    type: 'receive',
    file,
    databaseName: storage.databaseName,
    latestStamp: storage.clock.latest
  } satisfies ExchangeWorkerRequest);
  const done = previewed.then(
    (m): ReceiveSession => {
      if (m.type !== 'previewed') throw new Error('The file could not be processed: unexpected answer');
      return {
        preview: m.preview,
        merge: async (choices, source, written) => {
          const merged = answer();
          onWritten = written;
          merging = true;
          worker.postMessage({
            type: 'merge',
            // Plain copies: the page's choices may be reactive proxies, which cannot be posted.
            choices: { rule: choices.rule, perConflict: { ...choices.perConflict } },
            source: { ...source },
            latestStamp: storage.clock.latest
          } satisfies ExchangeWorkerRequest);
          let m: ExchangeWorkerMessage;
          try {
            m = await merged;
          } finally {
            merging = false;
          }
          end();
          if (m.type !== 'merged') throw new Error('The merge could not be finished: unexpected answer');
          storage.exchange.mergedElsewhere(m.outcome.marks);
          return m.outcome;
        },
        // Not while merging: terminated then, the worker would abort the merge the person confirmed.
        close: () => {
          if (!merging) end();
        }
      };
    },
    (error: unknown) => {
      end();
      throw error;
    }
  );
  return {
    done,
    cancel: () => {
      end();
      settle(new Error('Cancelled: nothing was imported'));
    }
  };
}

/**
 * A scope of this device's records collected and written as a file in a worker of its own (writeExport): the
 * records never reach the page. Nothing is remembered: call rememberExport once the file is handed over.
 */
export function exportInWorker(
  storage: CapstanStorage,
  scope: ExportScope,
  identity: ExportIdentity,
  options: ExportOptions,
  onStage: (label: string) => void
): { done: Promise<ExportedFile>; cancel: () => void } {
  return run<ExportedFile>(
    // Plain copies: the page's choices may be reactive proxies, which cannot be posted.
    {
      type: 'export',
      databaseName: storage.databaseName,
      scope: { ...scope },
      identity: { ...identity },
      options: { ...options }
    },
    onStage,
    (m) => (m.type === 'exported' ? m.file : undefined)
  );
}
