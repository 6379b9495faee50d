/// <reference lib="webworker" />
/**
 * The quarterly review computed away from the page: the worker reads the portfolio from IndexedDB itself
 * (storage/portfolio-reader.ts), ranks up to ten quarters and posts back only the figures the page shows. At a
 * company's size this is seconds of work that would otherwise freeze the page. The worker lives as long as the
 * page and keeps the window figures of earlier requests, so a note, a site filter or another quarter re-judges
 * from what it already knows.
 */
import type { ContextProfile } from '../domain/context-profile';
import { quarterCoverage, type QuarterCoverage } from '../domain/quarter-coverage';
import { buildQuarterReview } from '../domain/quarter-review';
import { statisticsOf } from '../domain/monthly-statistics';
import type { ReportingCurrency } from '../domain/reporting-currency';
import type { ReviewFigures } from '../domain/review-figures';
import type { Site } from '../domain/site';
import { servePortfolioRequests, type PortfolioWorkerRequest } from './portfolio-worker-loop';

export interface QuarterReviewRequest extends PortfolioWorkerRequest {
  quarter: string;
  siteIds: string[];
  profiles: readonly ContextProfile[];
  reporting?: ReportingCurrency;
}

export type QuarterReviewMessage =
  | {
      id: number;
      type: 'done';
      figures: ReviewFigures;
      /** Who reported in the quarter (from the read model, here rather than on the page's thread). */
      coverage: QuarterCoverage;
      sites: Site[];
      ms: number;
    }
  | { id: number; type: 'error'; message: string };

type Done = Extract<QuarterReviewMessage, { type: 'done' }>;

servePortfolioRequests<QuarterReviewRequest, Omit<Done, 'id' | 'type' | 'ms'>>(
  (records, { quarter, siteIds, profiles, reporting }, cache) => ({
    figures: buildQuarterReview(records, profiles, {
      quarter,
      siteIds,
      cache,
      ...(reporting ? { reporting } : {})
    }),
    coverage: quarterCoverage(records, statisticsOf(records), quarter),
    sites: [...records.sites].sort((a, b) => a.name.localeCompare(b.name))
  }),
  // A line per process, twice: sent in parts (a 13 MB answer at 20 000 processes).
  [
    ['figures', 'processes'],
    ['figures', 'movers']
  ]
);
