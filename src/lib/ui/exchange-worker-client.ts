import { emptyRecords, type RecordKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import type { ChangeSet } from '../exchange/exchange-file';
import type { ExchangeWorkerMessage, ExchangeWorkerRequest } from '../workers/exchange-file.worker';
import { workerJob } from './worker-job';

/** Words for the stages the exchange worker reports, for a status line. */
export const STAGE_LABEL: Record<string, string> = {
  reading: 'Reading the file…',
  unpacking: 'Unpacking…',
  parsing: 'Reading the records…',
  verifying: 'Checking the content hash and every record…',
  writing: 'Writing the file…'
};

/** Runs one request in a fresh worker (worker-job.ts), reporting its stages. */
function run<T>(
  request: ExchangeWorkerRequest,
  onStage: (label: string) => void,
  pick: (m: ExchangeWorkerMessage) => T | undefined
): { done: Promise<T>; cancel: () => void } {
  return workerJob<ExchangeWorkerRequest, ExchangeWorkerMessage, T>(
    () => new Worker(new URL('../workers/exchange-file.worker.ts', import.meta.url), { type: 'module' }),
    request,
    (m) => {
      if (m.type === 'stage') {
        onStage(STAGE_LABEL[m.stage] ?? m.stage);
        return undefined;
      }
      if (m.type === 'refused') return { refused: m.message };
      const value = pick(m);
      return value === undefined ? undefined : { result: value };
    },
    { failed: 'The file could not be processed', cancelled: 'Cancelled: nothing was imported' }
  );
}

export function decodeInWorker(file: Blob, onStage: (label: string) => void) {
  // The records arrive in parts (exchange-file.worker.ts), the header last.
  const records = emptyRecords() as unknown as Record<RecordKind, RecordMeta[]>;
  return run<ChangeSet>({ type: 'decode', file }, onStage, (m) => {
    if (m.type === 'records') {
      const list = records[m.kind];
      for (const r of m.records) list.push(r);
      return undefined;
    }
    return m.type === 'decoded'
      ? { header: m.header, records: records as unknown as ChangeSet['records'] }
      : undefined;
  });
}

export function encodeInWorker(changeSet: ChangeSet, gzip: boolean, onStage: (label: string) => void) {
  return run<Uint8Array>({ type: 'encode', changeSet, gzip }, onStage, (m) =>
    m.type === 'encoded' ? m.bytes : undefined
  );
}
