import type { QuarterReviewMessage, QuarterReviewRequest } from '../workers/quarter-review.worker';
import type { ReadAheadRequest } from '../workers/portfolio-worker-loop';
import { sendReadAhead } from './portfolio-read-ahead.svelte';
import { workerService, type WorkerService } from './worker-service';

export type QuarterReviewAnswer = Extract<QuarterReviewMessage, { type: 'done' }>;

/** The review page's worker (workers/quarter-review.worker.ts), kept for the page's visit. */
export function quarterReviewWorker(): WorkerService<
  Omit<QuarterReviewRequest, 'id'>,
  QuarterReviewAnswer
> & {
  /** Has the worker read the records now, ahead of the first review (portfolio-read-ahead.svelte.ts). */
  readAhead: (databaseName: string) => void;
} {
  const service = workerService<
    Omit<QuarterReviewRequest, 'id'> | Omit<ReadAheadRequest, 'id'>,
    QuarterReviewAnswer
  >(
    () => new Worker(new URL('../workers/quarter-review.worker.ts', import.meta.url), { type: 'module' }),
    'The review could not be computed'
  );
  return {
    ...service,
    readAhead: (databaseName) => sendReadAhead(service, databaseName)
  };
}
