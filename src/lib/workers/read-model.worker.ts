/// <reference lib="webworker" />
/**
 * Brings the stored read model (domain/monthly-statistics.ts) up to date in the background after a large write
 * — a merged exchange file — so that the next page that ranks restores it instead of reading every study
 * while the person waits.
 */
import { readPortfolio, SEQ_MARGIN_MS } from '../storage/portfolio-reader';

export interface ReadModelRefreshRequest {
  databaseName: string;
}

export type ReadModelRefreshMessage = { type: 'done'; source: string } | { type: 'refused'; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = async (event: MessageEvent<ReadModelRefreshRequest>) => {
  try {
    // Read once the write is past the reader's margin: the studies written within it before the read began are
    // read again on the next visit (the last quarter second of a 2 000-process merge: 3 500 studies).
    await new Promise((resolve) => setTimeout(resolve, SEQ_MARGIN_MS + 50));
    const read = await readPortfolio(event.data.databaseName);
    await read.persist();
    scope.postMessage({ type: 'done', source: read.source } satisfies ReadModelRefreshMessage);
  } catch (error) {
    scope.postMessage({
      type: 'refused',
      message: error instanceof Error ? error.message : String(error)
    } satisfies ReadModelRefreshMessage);
  }
};
