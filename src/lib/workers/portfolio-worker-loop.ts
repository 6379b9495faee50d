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
 * Read the records and nothing more, answered `{ id, type: 'done', ms }`: a page sends it as soon as storage is
 * open, so that the stored read model is restored while the page still reads what its first request needs.
 */
export interface ReadAheadRequest extends PortfolioWorkerRequest {
  readAhead: true;
}

/**
 * The loop the ranking and the review workers share: keep the records (with the read model) and the window
 * figures between requests, read them again when the page says they changed, answer with what `compute`
 * makes of them, then store the read model once the answer is on its way (a failure there only means the next
 * visit catches up). Any error is answered as `{ id, type: 'error', message }`. The lists at `longLists` (paths
 * of keys into the answer) go ahead of it in parts (answer-parts.ts).
 *
 * Requests are read and answered one after another: a page's first request usually arrives while its
 * read-ahead (ReadAheadRequest) is still reading, and then reads only what was written since. Storing the read
 * model runs beside the requests after it (at 20 000 processes it takes seconds); a read-ahead leaves its own
 * for after the request it read for, so that a device's first ranking is not slowed by it.
 */
export function servePortfolioRequests<Request extends PortfolioWorkerRequest, Answer extends object>(
  compute: (records: PortfolioRecords, request: Request, cache: FiguresCache) => Answer,
  longLists: readonly (readonly string[])[] = []
): void {
  const scope = self as unknown as DedicatedWorkerGlobalScope;
  const cache: FiguresCache = new WindowFiguresCache();
  let records: PortfolioRecords | undefined;
  /** A read-ahead's storing of the read model, left for after the request it was made for has been answered. */
  let held: (() => Promise<void>) | undefined;
  /** Answers one request; what is left to do once it is answered (store the read model), if anything. */
  const answer = async (request: Request | ReadAheadRequest): Promise<(() => Promise<void>) | undefined> => {
    const started = performance.now();
    try {
      let persist: (() => Promise<void>) | undefined;
      if (request.reload || !records) ({ records, persist } = await readPortfolio(request.databaseName));
      if ('readAhead' in request) {
        held = persist ?? held;
        scope.postMessage({ id: request.id, type: 'done', ms: performance.now() - started });
        return undefined;
      }
      const { parts, answer } = answerInParts(request.id, compute(records, request, cache), longLists);
      for (const part of parts) scope.postMessage(part);
      scope.postMessage({ id: request.id, type: 'done', ...answer, ms: performance.now() - started });
      return persist ?? held;
    } catch (error) {
      scope.postMessage({
        id: request.id,
        type: 'error',
        message: error instanceof Error ? error.message : String(error)
      });
      return undefined;
    } finally {
      if (!('readAhead' in request)) held = undefined;
    }
  };
  let turn: Promise<unknown> = Promise.resolve();
  scope.onmessage = (event: MessageEvent<Request | ReadAheadRequest>) => {
    const answered = turn.then(() => answer(event.data));
    turn = answered.catch(() => undefined);
    void answered.then((persist) => persist?.().catch(() => undefined));
  };
}
