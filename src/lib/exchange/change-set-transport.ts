import { decodeExchangeFile, encodeExchangeFile, exchangeFileName, type ChangeSet } from './exchange-file';

/**
 * How change sets travel between devices. The merge never sees this: it takes a change set (records with
 * version vectors and clock stamps) and a checkpoint per peer, wherever they came from. The first transport is
 * a file the person carries; a later one can push the same change sets to a replicating database server
 * (e.g. a CouchDB-style `_bulk_docs` endpoint) by implementing these two methods.
 */
export interface ChangeSetTransport {
  /** Delivers one change set to its recipient (for files: hands the bytes to whoever saves them). */
  send(changeSet: ChangeSet): Promise<void>;
  /** Change sets waiting for this device (for files: the ones the person picked), checked and decoded. */
  receive(): Promise<ChangeSet[]>;
}

/** Files: `save` writes bytes under a name (a download in the browser, a path on the command line). */
export function fileTransport(options: {
  save: (bytes: Uint8Array, fileName: string) => Promise<void> | void;
  pick: () => Promise<Uint8Array[]>;
  gzip?: boolean;
}): ChangeSetTransport {
  return {
    async send(changeSet) {
      const bytes = await encodeExchangeFile(changeSet, { gzip: options.gzip });
      await options.save(bytes, exchangeFileName(changeSet.header, options.gzip ?? false));
    },
    async receive() {
      const files = await options.pick();
      const out: ChangeSet[] = [];
      for (const bytes of files) out.push(await decodeExchangeFile(bytes));
      return out;
    }
  };
}
