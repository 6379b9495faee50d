/// <reference lib="webworker" />
import { WindowFiguresCache } from '../domain/window-figures-cache';
import type { FiguresCache, PortfolioRecords } from '../domain/portfolio-terms';
import { readPortfolio } from '../storage/portfolio-reader';
import { answerInParts } from './answer-parts';

/** What every request to a portfolio worker carries. */
export interface PortfolioWorkerRequest {
  id: number;
  databaseName: string;
  /** Read the records again: the page saw its tables change since the last request. */
  reload: boolean;
}

/**
 * The loop the ranking and the review workers share: keep the records (with the read model) and the window
 * figures between requests, read them again when the page says they changed, answer with what `compute`
 * makes of them, then store the read model once the answer is on its way (a failure there only means the next
 * visit catches up). Any error is answered as `{ id, type: 'error', message }`. The lists at `longLists` (paths
 * of keys into the answer) go ahead of it in parts (answer-parts.ts).
 */
export function servePortfolioRequests<Request extends PortfolioWorkerRequest, Answer extends object>(
  compute: (records: PortfolioRecords, request: Request, cache: FiguresCache) => Answer,
  longLists: readonly (readonly string[])[] = []
): void {
  const scope = self as unknown as DedicatedWorkerGlobalScope;
  const cache: FiguresCache = new WindowFiguresCache();
  let records: PortfolioRecords | undefined;
  scope.onmessage = async (event: MessageEvent<Request>) => {
    const request = event.data;
    const started = performance.now();
    try {
      let persist: (() => Promise<void>) | undefined;
      if (request.reload || !records) ({ records, persist } = await readPortfolio(request.databaseName));
      const { parts, answer } = answerInParts(request.id, compute(records, request, cache), longLists);
      for (const part of parts) scope.postMessage(part);
      scope.postMessage({ id: request.id, type: 'done', ...answer, ms: performance.now() - started });
      await persist?.().catch(() => undefined);
    } catch (error) {
      scope.postMessage({
        id: request.id,
        type: 'error',
        message: error instanceof Error ? error.message : String(error)
      });
    }
  };
}
