import type { PortfolioFilters } from '../domain/portfolio-filters';
import type { ProcessRow, ProcessTrend } from '../domain/portfolio-terms';
import type {
  CsvAsked,
  PortfolioRankingMessage,
  RankingAnswer,
  RankingAsked,
  RowAsked,
  TrendsAsked
} from '../workers/portfolio-ranking.worker';
import type { PortfolioWorkerRequest, ReadAheadRequest } from '../workers/portfolio-worker-loop';
import { sendReadAhead } from './portfolio-read-ahead.svelte';
import { workerService } from './worker-service';

type Done = Extract<PortfolioRankingMessage, { type: 'done' }>;

/** The ranked list as the page receives it, with the time the worker took. */
export type PortfolioRankingAnswer = RankingAnswer & { ms: number };

export interface PortfolioRanker {
  rank: (
    request: RankingAsked & { databaseName: string; reload: boolean }
  ) => Promise<PortfolioRankingAnswer>;
  /** The full row of one process of the last ranking; undefined if it was not ranked. */
  row: (databaseName: string, processId: string) => Promise<ProcessRow | undefined>;
  /** The last ranking's rows the filters let through, as CSV. */
  csv: (databaseName: string, filters: PortfolioFilters) => Promise<string>;
  /** The monthly trend lines of these processes, as of the last ranking. */
  trends: (databaseName: string, processIds: string[]) => Promise<Map<string, ProcessTrend>>;
  /** Starts the worker now (its code loads while the page gets ready). */
  start: () => void;
  /** Has the worker read the records now, ahead of the first ranking (portfolio-read-ahead.svelte.ts). */
  readAhead: (databaseName: string) => void;
  close: () => void;
}

/**
 * The portfolio page's worker (workers/portfolio-ranking.worker.ts), kept for the page's visit. Requests are
 * answered in order, so a row or the CSV asked after a ranking comes from that ranking.
 */
export function portfolioRankingWorker(): PortfolioRanker {
  const service = workerService<
    | (Omit<PortfolioWorkerRequest, 'id'> & (RankingAsked | RowAsked | CsvAsked | TrendsAsked))
    | Omit<ReadAheadRequest, 'id'>,
    Done
  >(
    () => new Worker(new URL('../workers/portfolio-ranking.worker.ts', import.meta.url), { type: 'module' }),
    'The portfolio could not be ranked'
  );
  return {
    rank: async (request) => (await service.ask(request)) as Done & PortfolioRankingAnswer,
    row: async (databaseName, processId) =>
      ((await service.ask({ databaseName, reload: false, ask: 'row', processId })) as { row?: ProcessRow })
        .row,
    csv: async (databaseName, filters) =>
      ((await service.ask({ databaseName, reload: false, ask: 'csv', filters })) as { csv: string }).csv,
    trends: async (databaseName, processIds) =>
      new Map(
        (
          (await service.ask({ databaseName, reload: false, ask: 'trends', processIds })) as {
            trends: [string, ProcessTrend][];
          }
        ).trends
      ),
    start: service.start,
    readAhead: (databaseName) => sendReadAhead(service, databaseName),
    close: service.close
  };
}
