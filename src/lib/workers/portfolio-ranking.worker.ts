/// <reference lib="webworker" />
/**
 * The portfolio ranked away from the page: the worker reads the records from IndexedDB itself
 * (storage/portfolio-reader.ts) when the page says they changed, keeps them and the window figures between
 * requests, and posts back the ranked list's rows (domain/portfolio-list-row.ts), not the full rows. A change
 * of window, order, weight or target then costs a re-judgement and a sort here, and nothing on the page's
 * thread but receiving the list. The full rows of the last ranking stay here: one of them is sent when the
 * page opens its details, and the CSV of the filtered list is written here.
 *
 * The ranking is computed without the rows' monthly trend lines: the page asks for those of the rows it shows
 * (domain processTrends), and the details and the CSV get theirs when they are asked for.
 */
import type { ContextProfile } from '../domain/context-profile';
import { filterRows, type PortfolioFilters } from '../domain/portfolio-filters';
import { listRowOf, type PortfolioListRow } from '../domain/portfolio-list-row';
import { processTrends, rankPortfolio, withTrends } from '../domain/portfolio-ranking';
import type { ProcessRow, ProcessTrend, RankingOrder, RankingWeights } from '../domain/portfolio-terms';
import { portfolioCsv } from '../spreadsheet/portfolio-csv';
import { servePortfolioRequests, type PortfolioWorkerRequest } from './portfolio-worker-loop';

export interface RankingAsked {
  ask: 'rank';
  endPeriod: string;
  windowMonths: number;
  order: RankingOrder;
  weights: RankingWeights;
  profiles: readonly ContextProfile[];
}
/** The full row of one process of the last ranking (its details panel). */
export interface RowAsked {
  ask: 'row';
  processId: string;
}
/** The last ranking's rows the filters let through, as CSV. */
export interface CsvAsked {
  ask: 'csv';
  filters: PortfolioFilters;
}
/** The monthly trend lines of these processes, for the last ranking's end month and contexts. */
export interface TrendsAsked {
  ask: 'trends';
  processIds: string[];
}

export type PortfolioRankingRequest = PortfolioWorkerRequest &
  (RankingAsked | RowAsked | CsvAsked | TrendsAsked);

export interface RankingAnswer {
  rows: PortfolioListRow[];
  /** Live processes and sites stored, ranked or not (the page's empty states). */
  processes: number;
  sites: number;
}

/** What each kind of request is answered with. */
type Answer =
  RankingAnswer | { row: ProcessRow | undefined } | { csv: string } | { trends: [string, ProcessTrend][] };

export type PortfolioRankingMessage =
  ({ id: number; type: 'done'; ms: number } & Answer) | { id: number; type: 'error'; message: string };

let last:
  | { rows: ProcessRow[]; endPeriod: string; windowMonths: number; profiles: readonly ContextProfile[] }
  | undefined;

servePortfolioRequests<PortfolioRankingRequest, Answer>((records, request, cache) => {
  if (request.ask === 'rank') {
    const { endPeriod, windowMonths, order, weights, profiles } = request;
    const rows = rankPortfolio(records, profiles, {
      endPeriod,
      windowMonths,
      order,
      weights,
      cache,
      trendMonths: 0
    });
    last = { rows, endPeriod, windowMonths, profiles };
    return { rows: rows.map(listRowOf), processes: records.processes.length, sites: records.sites.length };
  }
  if (!last) throw new Error('nothing has been ranked yet');
  const { profiles, endPeriod } = last;
  switch (request.ask) {
    case 'trends':
      return { trends: [...processTrends(records, profiles, request.processIds, { endPeriod })] };
    case 'row': {
      const row = last.rows.find((r) => r.process.id === request.processId);
      return { row: row && withTrends(records, profiles, [row], { endPeriod })[0] };
    }
    case 'csv': {
      const rows = withTrends(records, profiles, filterRows(last.rows, request.filters), { endPeriod });
      return { csv: portfolioCsv(rows, last) };
    }
  }
});
