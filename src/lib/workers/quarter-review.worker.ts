/// <reference lib="webworker" />
/**
 * The quarterly review computed away from the page: the worker reads the portfolio from IndexedDB itself
 * (storage/portfolio-reader.ts), ranks up to ten quarters and posts back only the figures the page shows. At a
 * company's size this is seconds of work that would otherwise freeze the page. The worker lives as long as the
 * page and keeps the window figures of earlier requests, so a note, a site filter or another quarter re-judges
 * from what it already knows.
 */
import { WindowFiguresCache } from '../domain/window-figures-cache';
import type { ContextProfile } from '../domain/context-profile';
import type { FiguresCache, PortfolioRecords } from '../domain/portfolio-terms';
import { quarterCoverage, type QuarterCoverage } from '../domain/quarter-coverage';
import { buildQuarterReview } from '../domain/quarter-review';
import { statisticsOf } from '../domain/monthly-statistics';
import type { ReportingCurrency } from '../domain/reporting-currency';
import type { ReviewFigures } from '../domain/review-figures';
import type { Site } from '../domain/site';
import { readPortfolio } from '../storage/portfolio-reader';

export interface QuarterReviewRequest {
  id: number;
  databaseName: string;
  /** Read the records again: the page saw its tables change since the last request. */
  reload: boolean;
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

const scope = self as unknown as DedicatedWorkerGlobalScope;
const cache: FiguresCache = new WindowFiguresCache();
let records: PortfolioRecords | undefined;

scope.onmessage = async (event: MessageEvent<QuarterReviewRequest>) => {
  const { id, databaseName, reload, quarter, siteIds, profiles, reporting } = event.data;
  const started = performance.now();
  try {
    let persist: (() => Promise<void>) | undefined;
    if (reload || !records) ({ records, persist } = await readPortfolio(databaseName));
    const figures = buildQuarterReview(records, profiles, {
      quarter,
      siteIds,
      cache,
      ...(reporting ? { reporting } : {})
    });
    scope.postMessage({
      id,
      type: 'done',
      figures,
      coverage: quarterCoverage(records, statisticsOf(records), quarter),
      sites: [...records.sites].sort((a, b) => a.name.localeCompare(b.name)),
      ms: performance.now() - started
    } satisfies QuarterReviewMessage);
    // The read model is stored once the answer is on its way; a failure only means the next visit catches up.
    await persist?.().catch(() => undefined);
  } catch (error) {
    scope.postMessage({
      id,
      type: 'error',
      message: error instanceof Error ? error.message : String(error)
    } satisfies QuarterReviewMessage);
  }
};
