import type { QuarterReviewMessage, QuarterReviewRequest } from '../workers/quarter-review.worker';
import { workerService, type WorkerService } from './worker-service';

export type QuarterReviewAnswer = Extract<QuarterReviewMessage, { type: 'done' }>;

/** The review page's worker (workers/quarter-review.worker.ts), kept for the page's visit. */
export function quarterReviewWorker(): WorkerService<Omit<QuarterReviewRequest, 'id'>, QuarterReviewAnswer> {
  return workerService(
    () => new Worker(new URL('../workers/quarter-review.worker.ts', import.meta.url), { type: 'module' }),
    'The review could not be computed'
  );
}
