import type { PortfolioRankingMessage, PortfolioRankingRequest } from '../workers/portfolio-ranking.worker';
import { workerService, type WorkerService } from './worker-service';

export type PortfolioRankingAnswer = Extract<PortfolioRankingMessage, { type: 'done' }>;

/** The portfolio page's worker (workers/portfolio-ranking.worker.ts), kept for the page's visit. */
export function portfolioRankingWorker(): WorkerService<
  Omit<PortfolioRankingRequest, 'id'>,
  PortfolioRankingAnswer
> {
  return workerService(
    () => new Worker(new URL('../workers/portfolio-ranking.worker.ts', import.meta.url), { type: 'module' }),
    'The portfolio could not be ranked'
  );
}
