/// <reference lib="webworker" />
/**
 * Reads, checks and writes exchange files off the page's thread, so that a file of 100 000 studies never
 * freezes it: parsing, hashing and schema validation run here, and the page only shows the stage reached.
 * Nothing here touches the database; cancelling terminates the worker and leaves nothing behind.
 */
import {
  decodeExchangeFile,
  encodeExchangeFile,
  ExchangeFileError,
  sizeProblem,
  type ChangeSet,
  type DecodeStage
} from '../exchange/exchange-file';
import { RECORD_KINDS, type RecordKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';

/**
 * Records per message: the page copies each message in from this worker in one task, and 72 000 studies in one
 * message held it for 0.4 s (more on a slow device); a few thousand take a few tens of milliseconds.
 */
const RECORDS_PER_MESSAGE = 4000;

export type ExchangeWorkerRequest =
  { type: 'decode'; file: Blob } | { type: 'encode'; changeSet: ChangeSet; gzip: boolean };

export type ExchangeWorkerMessage =
  | { type: 'stage'; stage: DecodeStage | 'reading' | 'writing' }
  /** Records of a decoded file, a part at a time (see RECORDS_PER_MESSAGE); then 'decoded' with its header. */
  | { type: 'records'; kind: RecordKind; records: RecordMeta[] }
  | { type: 'decoded'; header: ChangeSet['header'] }
  | { type: 'encoded'; bytes: Uint8Array }
  | { type: 'refused'; message: string };

const post = (m: ExchangeWorkerMessage, transfer: Transferable[] = []) =>
  (self as unknown as DedicatedWorkerGlobalScope).postMessage(m, transfer);

self.onmessage = async (event: MessageEvent<ExchangeWorkerRequest>) => {
  const request = event.data;
  try {
    if (request.type === 'decode') {
      const tooBig = sizeProblem(request.file.size);
      if (tooBig) throw new ExchangeFileError(tooBig);
      post({ type: 'stage', stage: 'reading' });
      const bytes = new Uint8Array(await request.file.arrayBuffer());
      const { header, records } = await decodeExchangeFile(bytes, (stage) => post({ type: 'stage', stage }));
      for (const kind of RECORD_KINDS) {
        const all = records[kind] as RecordMeta[];
        for (let i = 0; i < all.length; i += RECORDS_PER_MESSAGE)
          post({ type: 'records', kind, records: all.slice(i, i + RECORDS_PER_MESSAGE) });
      }
      post({ type: 'decoded', header });
    } else {
      post({ type: 'stage', stage: 'writing' });
      const bytes = await encodeExchangeFile(request.changeSet, { gzip: request.gzip });
      post({ type: 'encoded', bytes }, [bytes.buffer]);
    }
  } catch (error) {
    post({
      type: 'refused',
      message: error instanceof Error ? error.message : `The file could not be read: ${String(error)}`
    });
  }
};
