/// <reference lib="webworker" />
/**
 * Brings the stored read model (domain/monthly-statistics.ts) up to date in the background after a large write
 * — a merged exchange file — so that the next page that ranks restores it instead of reading every study
 * while the person waits.
 */
import { readPortfolio } from '../storage/portfolio-reader';

export interface ReadModelRefreshRequest {
  databaseName: string;
}

export type ReadModelRefreshMessage = { type: 'done'; source: string } | { type: 'refused'; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = async (event: MessageEvent<ReadModelRefreshRequest>) => {
  try {
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
