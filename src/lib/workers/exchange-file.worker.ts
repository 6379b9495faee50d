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

export type ExchangeWorkerRequest =
  { type: 'decode'; file: Blob } | { type: 'encode'; changeSet: ChangeSet; gzip: boolean };

export type ExchangeWorkerMessage =
  | { type: 'stage'; stage: DecodeStage | 'reading' | 'writing' }
  | { type: 'decoded'; changeSet: ChangeSet }
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
      const changeSet = await decodeExchangeFile(bytes, (stage) => post({ type: 'stage', stage }));
      post({ type: 'decoded', changeSet });
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
