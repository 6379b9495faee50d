/// <reference lib="webworker" />
/**
 * The portfolio ranked away from the page: the worker reads the records from IndexedDB itself
 * (storage/portfolio-reader.ts) when the page says they changed, keeps them and the window figures between
 * requests, and posts back the ranked list as columns (domain/portfolio-list-columns.ts), not rows: the page
 * builds a row for each row it draws. A change of window, order, weight or target then costs a re-judgement
 * and a sort here, and nothing on the page's thread but receiving some thirty arrays. The last ranking stays
 * here: a full row is built when the page opens its details, and the CSV of the filtered list is written here.
 *
 * The ranking is computed without the rows' monthly trend lines: the page asks for those of the rows it shows
 * (domain processTrends), and the details and the CSV get theirs when they are asked for.
 */
import type { ContextProfile } from '../domain/context-profile';
import type { PortfolioFilters } from '../domain/portfolio-filters';
import { filteredEntries, type PortfolioListColumns } from '../domain/portfolio-list-columns';
import { listColumnsOf } from '../domain/portfolio-list-of-ranking';
import {
  processTrends,
  rankedPortfolio,
  withTrends,
  type RankedPortfolio
} from '../domain/portfolio-ranking';
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
  list: PortfolioListColumns;
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
  | {
      ranked: RankedPortfolio;
      list: PortfolioListColumns;
      endPeriod: string;
      windowMonths: number;
      profiles: readonly ContextProfile[];
    }
  | undefined;

servePortfolioRequests<PortfolioRankingRequest, Answer>((records, request, cache) => {
  if (request.ask === 'rank') {
    const { endPeriod, windowMonths, order, weights, profiles } = request;
    const ranked = rankedPortfolio(records, profiles, {
      endPeriod,
      windowMonths,
      order,
      weights,
      cache,
      trendMonths: 0
    });
    const list = listColumnsOf(ranked);
    last = { ranked, list, endPeriod, windowMonths, profiles };
    return { list, processes: records.processes.length, sites: records.sites.length };
  }
  if (!last) throw new Error('nothing has been ranked yet');
  const { profiles, endPeriod, ranked, list } = last;
  switch (request.ask) {
    case 'trends':
      return { trends: [...processTrends(records, profiles, request.processIds, { endPeriod })] };
    case 'row': {
      const at = ranked.plan.processes.findIndex((p) => p.id === request.processId);
      return {
        row: at < 0 ? undefined : withTrends(records, profiles, [ranked.rowAt(at)], { endPeriod })[0]
      };
    }
    case 'csv': {
      // The list's entries are in ranked order: entry i is the plan's process order[i].
      const chosen = Array.from(filteredEntries(list, request.filters), (i) =>
        ranked.rowAt(ranked.order[i]!)
      );
      return { csv: portfolioCsv(withTrends(records, profiles, chosen, { endPeriod }), last) };
    }
  }
});
