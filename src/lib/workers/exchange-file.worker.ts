/// <reference lib="webworker" />
/**
 * Reads, checks, compares and merges exchange files, and collects and writes them, off the page's thread, so that
 * a company's file never freezes it: parsing, hashing and schema validation, the comparison with the records stored here and the
 * merge's writes all run here, and the page only shows the stage reached, the preview and the progress. The
 * file's records never reach the page: at company size (720 000 studies) they and the merge's plan took a
 * gigabyte of its memory, and its garbage collection held it for seconds.
 *
 * A received file is one conversation: 'receive' reads and compares it (nothing written) and answers
 * 'previewed'; 'merge' writes it with the person's choices in one transaction and answers 'merged'. The page
 * terminates the worker when the file is discarded, cancelled or merged; terminated while merging, the
 * transaction is aborted and nothing is written.
 */
import type { MergeChoices } from '../domain/change-set-merge';
import { decodeExchangeFile, ExchangeFileError, type DecodeStage } from '../exchange/exchange-file';
import { sizeProblem } from '../exchange/exchange-guards';
import { useExchangeHost } from '../exchange/exchange-host';
import {
  exchangeMediaType,
  writeExport,
  type ExportedFile,
  type ExportIdentity,
  type ExportOptions,
  type ExportScope
} from '../exchange/export-change-set';
import {
  receiveChangeSet,
  type MergeOutcome,
  type ReceivePreview,
  type ReceiveSession
} from '../exchange/receive-session';
import { PREBUILT_EXCHANGE_HOST } from '../exchange/prebuilt-exchange-host';
import { openStorage, type CapstanStorage } from '../storage/storage';

// The exchange schema checked by zod's parser for it, built ahead of time: the page's policy forbids compiling.
useExchangeHost(PREBUILT_EXCHANGE_HOST);

export type ExchangeWorkerRequest =
  | {
      type: 'receive';
      file: Blob;
      databaseName: string;
      /** The page's clock: what this worker writes is stamped after what the page has written. */
      latestStamp: string | undefined;
    }
  | {
      type: 'merge';
      choices: MergeChoices;
      source: { deviceId: string; name: string; at: string };
      latestStamp: string | undefined;
    }
  | {
      type: 'export';
      databaseName: string;
      scope: ExportScope;
      identity: ExportIdentity;
      options: ExportOptions;
    };

export type ExchangeWorkerStage = DecodeStage | 'reading' | 'comparing' | 'collecting' | 'writing';

export type ExchangeWorkerMessage =
  | { type: 'stage'; stage: ExchangeWorkerStage }
  | { type: 'previewed'; preview: ReceivePreview }
  | { type: 'written'; written: number; total: number }
  | { type: 'merged'; outcome: MergeOutcome }
  | { type: 'exported'; file: ExportedFile }
  | { type: 'refused'; message: string };

const post = (m: ExchangeWorkerMessage, transfer: Transferable[] = []) =>
  (self as unknown as DedicatedWorkerGlobalScope).postMessage(m, transfer);

/** The file received and compared, waiting for the person's decision. */
let received: { storage: CapstanStorage; session: ReceiveSession } | undefined;

async function receive(file: Blob, databaseName: string, latestStamp: string | undefined): Promise<void> {
  const tooBig = sizeProblem(file.size);
  if (tooBig) throw new ExchangeFileError(tooBig);
  post({ type: 'stage', stage: 'reading' });
  const bytes = new Uint8Array(await file.arrayBuffer());
  const changeSet = await decodeExchangeFile(bytes, (stage) => post({ type: 'stage', stage }));
  post({ type: 'stage', stage: 'comparing' });
  const storage = await openStorage(databaseName);
  storage.clock.observe(latestStamp);
  received = { storage, session: await receiveChangeSet(storage, changeSet) };
  post({ type: 'previewed', preview: received.session.preview });
}

async function merge(request: Extract<ExchangeWorkerRequest, { type: 'merge' }>): Promise<void> {
  if (!received) throw new Error('No file has been read: read it again to merge it');
  received.storage.clock.observe(request.latestStamp);
  const outcome = await received.session.merge(request.choices, request.source, (written, total) =>
    post({ type: 'written', written, total })
  );
  received.storage.close();
  received = undefined;
  post({ type: 'merged', outcome });
}

/** A scope collected from the database and written as a file here; the page downloads it and remembers it. */
async function exportFile(request: Extract<ExchangeWorkerRequest, { type: 'export' }>): Promise<void> {
  post({ type: 'stage', stage: 'collecting' });
  const storage = await openStorage(request.databaseName);
  try {
    const file = await writeExport(storage, request.scope, request.identity, request.options, () =>
      post({ type: 'stage', stage: 'writing' })
    );
    // The Blob copies the bytes here, off the page's thread; posting it passes a handle.
    const blob = new Blob([file.bytes as BlobPart], { type: exchangeMediaType(request.options.gzip) });
    post({ type: 'exported', file: { ...file, blob } }, [file.bytes.buffer]);
  } finally {
    storage.close();
  }
}

self.onmessage = async (event: MessageEvent<ExchangeWorkerRequest>) => {
  const request = event.data;
  try {
    if (request.type === 'receive') await receive(request.file, request.databaseName, request.latestStamp);
    else if (request.type === 'merge') await merge(request);
    else await exportFile(request);
  } catch (error) {
    post({
      type: 'refused',
      message: error instanceof Error ? error.message : `The file could not be read: ${String(error)}`
    });
  }
};
