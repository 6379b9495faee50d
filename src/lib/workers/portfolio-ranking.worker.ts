/// <reference lib="webworker" />
/**
 * The portfolio ranked away from the page: the worker reads the records from IndexedDB itself
 * (storage/portfolio-reader.ts) when the page says they changed, keeps them and the window figures between
 * requests, and posts back only the ranked rows. A change of window, order, weight or target then costs a
 * re-judgement and a sort here, and nothing on the page's thread but receiving the rows.
 */
import { WindowFiguresCache } from '../domain/window-figures-cache';
import type { ContextProfile } from '../domain/context-profile';
import { rankPortfolio } from '../domain/portfolio-ranking';
import type {
  FiguresCache,
  PortfolioRecords,
  ProcessRow,
  RankingOrder,
  RankingWeights
} from '../domain/portfolio-terms';
import { readPortfolio } from '../storage/portfolio-reader';

export interface PortfolioRankingRequest {
  id: number;
  databaseName: string;
  /** Read the records again: the page saw its tables change since the last request. */
  reload: boolean;
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

const scope = self as unknown as DedicatedWorkerGlobalScope;
const cache: FiguresCache = new WindowFiguresCache();
let records: PortfolioRecords | undefined;

scope.onmessage = async (event: MessageEvent<PortfolioRankingRequest>) => {
  const { id, databaseName, reload, endPeriod, windowMonths, order, weights, profiles } = event.data;
  const started = performance.now();
  try {
    let persist: (() => Promise<void>) | undefined;
    if (reload || !records) ({ records, persist } = await readPortfolio(databaseName));
    const rows = rankPortfolio(records, profiles, { endPeriod, windowMonths, order, weights, cache });
    scope.postMessage({
      id,
      type: 'done',
      rows,
      processes: records.processes.length,
      sites: records.sites.length,
      ms: performance.now() - started
    } satisfies PortfolioRankingMessage);
    // The read model is stored once the answer is on its way; a failure only means the next visit catches up.
    await persist?.().catch(() => undefined);
  } catch (error) {
    scope.postMessage({
      id,
      type: 'error',
      message: error instanceof Error ? error.message : String(error)
    } satisfies PortfolioRankingMessage);
  }
};
