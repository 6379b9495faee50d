import { Worker } from 'node:worker_threads';
import type { ExchangeHost } from '../lib/exchange/exchange-host';
import type { WrittenFileFacts } from '../lib/exchange/written-file-facts';
import type { WrittenFactsAnswer, WrittenFactsRequest } from './written-facts-worker';

/**
 * The command line's thread for an exchange file's written facts (written-facts-worker.ts), started at once so
 * that it is ready when the file has been read: counting the keys of a company's 30 MB file and hashing it then
 * run on the machine's second core while the first parses it. The thread never keeps the process running; if
 * it cannot start or fails, every request answers undefined and the main thread takes the facts itself.
 */
export function writtenFactsThread(workerFile: URL): NonNullable<ExchangeHost['writtenFacts']> {
  const pending = new Map<number, (facts: WrittenFileFacts | undefined) => void>();
  let worker: Worker | undefined;
  const giveUp = () => {
    worker = undefined;
    for (const answer of pending.values()) answer(undefined);
    pending.clear();
  };
  try {
    worker = new Worker(workerFile);
    worker.on('message', ({ id, facts }: WrittenFactsAnswer) => {
      pending.get(id)?.(facts);
      pending.delete(id);
      if (pending.size === 0) worker?.unref();
    });
    worker.on('error', giveUp);
    worker.on('exit', giveUp);
    // After the listeners: adding a 'message' listener holds the process open again (Node 20).
    worker.unref();
  } catch {
    giveUp();
  }
  let next = 0;
  return (bytes) => {
    const thread = worker;
    if (!thread) return Promise.resolve(undefined);
    const id = next++;
    // Shared memory is read there as it is (the thread copies it for itself); other bytes are copied here and the
    // copy handed over: the thread writes a byte of it for a moment while hashing.
    const shared = bytes.buffer instanceof SharedArrayBuffer;
    const given = shared ? bytes : bytes.slice();
    const request: WrittenFactsRequest = {
      id,
      bytes: given.buffer,
      offset: given.byteOffset,
      length: given.byteLength
    };
    thread.ref();
    return new Promise((resolve) => {
      pending.set(id, resolve);
      thread.postMessage(request, shared ? [] : [given.buffer as ArrayBuffer]);
    });
  };
}
