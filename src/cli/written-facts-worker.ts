/**
 * The command line's second thread (written-facts-thread.ts): takes an exchange file's written facts — the keys
 * its text writes and the SHA-256 of its bytes (written-file-facts.ts) — while the main thread parses the same
 * bytes. Answers each request with the facts, or with none when it could not (the main thread then takes them).
 */
import { parentPort } from 'node:worker_threads';
import { useExchangeHost } from '../lib/exchange/exchange-host';
import { writtenFileFacts, type WrittenFileFacts } from '../lib/exchange/written-file-facts';
import { nodeSha256Hex } from './node-sha256';

export interface WrittenFactsRequest {
  id: number;
  /**
   * The file's bytes as the main thread decoded them: a copy handed over, or memory both threads share (then
   * copied here first, off the main thread: hashing writes a byte for a moment, which the main thread's bytes
   * must never see).
   */
  bytes: ArrayBuffer | SharedArrayBuffer;
  offset: number;
  length: number;
}

export interface WrittenFactsAnswer {
  id: number;
  facts: WrittenFileFacts | undefined;
}

useExchangeHost({ sha256Hex: nodeSha256Hex, prepareSchema: (schema) => schema });

// The time-zone data, loaded once per process by whichever thread asks first: here, while the main thread still
// reads the file, rather than there, when it checks the sites' time zones (11 ms on the main thread, under 1 ms
// once loaded).
new Intl.DateTimeFormat('en', { timeZone: 'UTC' });

parentPort?.on('message', ({ id, bytes, offset, length }: WrittenFactsRequest) => {
  const answer = (facts: WrittenFileFacts | undefined) =>
    parentPort?.postMessage({ id, facts } satisfies WrittenFactsAnswer);
  try {
    const given = new Uint8Array(bytes, offset, length);
    const view = bytes instanceof SharedArrayBuffer ? given.slice() : given;
    writtenFileFacts(new TextDecoder('utf-8').decode(view), view).then(answer, () => answer(undefined));
  } catch {
    answer(undefined);
  }
});
