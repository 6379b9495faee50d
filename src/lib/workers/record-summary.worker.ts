/// <reference lib="webworker" />
/**
 * Counts the records on this device for the File exchange page off the page's thread: it reads every study
 * (storage/portfolio-reader.ts, summariseRecords).
 */
import { summariseRecords, type DatabaseSummary } from '../storage/portfolio-reader';

export interface RecordSummaryRequest {
  databaseName: string;
}

export type RecordSummaryMessage =
  { type: 'done'; summary: DatabaseSummary } | { type: 'refused'; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = async (event: MessageEvent<RecordSummaryRequest>) => {
  try {
    const summary = await summariseRecords(event.data.databaseName);
    scope.postMessage({ type: 'done', summary } satisfies RecordSummaryMessage);
  } catch (error) {
    scope.postMessage({
      type: 'refused',
      message: error instanceof Error ? error.message : String(error)
    } satisfies RecordSummaryMessage);
  }
};
