/// <reference lib="webworker" />
/**
 * Background reads of this device's records, each in a fresh worker (ui/worker-job.ts), both through
 * storage/portfolio-reader.ts: bringing the stored read model (domain/monthly-statistics.ts) up to date after a
 * large write — a merged exchange file — so that the next page that ranks restores it instead of reading every
 * study while the person waits; and counting the records on the device for the File exchange page, which reads
 * every study. One worker for both: each worker that reads the database carries its own copy of Dexie (some
 * 100 KB of the service worker's precache).
 */
import {
  readPortfolio,
  SEQ_MARGIN_MS,
  summariseRecords,
  type DatabaseSummary
} from '../storage/portfolio-reader';

export type DeviceReaderRequest = { job: 'refresh-read-model' | 'count-records'; databaseName: string };

export type DeviceReaderMessage =
  | { type: 'refreshed'; source: string }
  | { type: 'counted'; summary: DatabaseSummary }
  | { type: 'refused'; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

async function answer({ job, databaseName }: DeviceReaderRequest): Promise<DeviceReaderMessage> {
  if (job === 'count-records') return { type: 'counted', summary: await summariseRecords(databaseName) };
  // Read once the write is past the reader's margin: the studies written within it before the read began are
  // read again on the next visit (the last quarter second of a 2 000-process merge: 3 500 studies).
  await new Promise((resolve) => setTimeout(resolve, SEQ_MARGIN_MS + 50));
  const read = await readPortfolio(databaseName);
  await read.persist();
  return { type: 'refreshed', source: read.source };
}

scope.onmessage = async (event: MessageEvent<DeviceReaderRequest>) => {
  try {
    scope.postMessage(await answer(event.data));
  } catch (error) {
    scope.postMessage({
      type: 'refused',
      message: error instanceof Error ? error.message : String(error)
    } satisfies DeviceReaderMessage);
  }
};
