/// <reference lib="webworker" />
/**
 * The portfolio ranked away from the page: the worker reads the records from IndexedDB itself
 * (storage/portfolio-reader.ts) when the page says they changed, keeps them and the window figures between
 * requests, and posts back only the ranked rows. A change of window, order, weight or target then costs a
 * re-judgement and a sort here, and nothing on the page's thread but receiving the rows.
 */
import type { ContextProfile } from '../domain/context-profile';
import { rankPortfolio } from '../domain/portfolio-ranking';
import type { ProcessRow, RankingOrder, RankingWeights } from '../domain/portfolio-terms';
import { servePortfolioRequests, type PortfolioWorkerRequest } from './portfolio-worker-loop';

export interface PortfolioRankingRequest extends PortfolioWorkerRequest {
  endPeriod: string;
  windowMonths: number;
  order: RankingOrder;
  weights: RankingWeights;
  profiles: readonly ContextProfile[];
}

export type PortfolioRankingMessage =
  | {
      id: number;
      type: 'done';
      rows: ProcessRow[];
      /** Live processes and sites stored, ranked or not (the page's empty states). */
      processes: number;
      sites: number;
      ms: number;
    }
  | { id: number; type: 'error'; message: string };

type Done = Extract<PortfolioRankingMessage, { type: 'done' }>;

servePortfolioRequests<PortfolioRankingRequest, Omit<Done, 'id' | 'type' | 'ms'>>(
  (records, { endPeriod, windowMonths, order, weights, profiles }, cache) => ({
    rows: rankPortfolio(records, profiles, { endPeriod, windowMonths, order, weights, cache }),
    processes: records.processes.length,
    sites: records.sites.length
  })
);
