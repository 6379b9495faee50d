import type { CapstanStorage } from '../storage/storage';
import type { ReadAheadRequest } from '../workers/portfolio-worker-loop';
import type { WorkerService } from './worker-service';

/**
 * A portfolio page's worker (the ranking's, the review's) started as the page opens, and asked to read the
 * records as soon as storage is open (workers/portfolio-worker-loop.ts, ReadAheadRequest): the page's first
 * request waits for storage, then for its own queries (the change mark, the context targets), and only then
 * started the worker — its code loading, then the stored read model restored, one after the other. Traced at
 * 2 000 processes with the CPU throttled 4×, the worker began some 0.3 s after storage was open on the first
 * visit after a merge. Only where the app is installed (a service worker controls the page, so the worker's
 * code is on the device): a first visit loads no worker before it has something to show.
 */
export function readAheadOnOpen(
  worker: { start: () => void; readAhead: (databaseName: string) => void },
  storage: () => CapstanStorage | undefined
): void {
  let asked = false;
  $effect(() => {
    if (asked || !navigator.serviceWorker?.controller) return;
    worker.start();
    const open = storage();
    if (!open) return;
    asked = true;
    worker.readAhead(open.databaseName);
  });
}

/** Sends a portfolio worker its read-ahead. A failure is the first request's to report: it reads again. */
export function sendReadAhead(
  service: WorkerService<Omit<ReadAheadRequest, 'id'>, unknown>,
  databaseName: string
): void {
  void service.ask({ databaseName, reload: true, readAhead: true }).catch(() => undefined);
}
