import type { QuarterReviewMessage, QuarterReviewRequest } from '../workers/quarter-review.worker';

export type QuarterReviewAnswer = Extract<QuarterReviewMessage, { type: 'done' }>;

/**
 * The review page's background worker (workers/quarter-review.worker.ts): one per page visit, so that it keeps
 * its window figures between requests; requests are answered in the order they were made. The worker starts on
 * the first request (never while the page is prerendered) and `close` ends it when the page goes.
 */
export function quarterReviewWorker(): {
  compute: (request: Omit<QuarterReviewRequest, 'id'>) => Promise<QuarterReviewAnswer>;
  close: () => void;
} {
  let worker: Worker | undefined;
  let next = 0;
  const waiting = new Map<
    number,
    { resolve: (a: QuarterReviewAnswer) => void; reject: (e: Error) => void }
  >();
  const failAll = (message: string) => {
    for (const w of waiting.values()) w.reject(new Error(`The review could not be computed: ${message}`));
    waiting.clear();
  };
  const start = (): Worker => {
    const w = new Worker(new URL('../workers/quarter-review.worker.ts', import.meta.url), { type: 'module' });
    w.onmessage = (event: MessageEvent<QuarterReviewMessage>) => {
      const m = event.data;
      const asked = waiting.get(m.id);
      waiting.delete(m.id);
      if (!asked) return;
      if (m.type === 'error') asked.reject(new Error(`The review could not be computed: ${m.message}`));
      else asked.resolve(m);
    };
    w.onerror = (event) => {
      failAll(event.message || 'the background worker stopped');
      worker = undefined;
    };
    return w;
  };
  return {
    compute: (request) =>
      new Promise((resolve, reject) => {
        worker ??= start();
        next += 1;
        waiting.set(next, { resolve, reject });
        worker.postMessage({ ...request, id: next } satisfies QuarterReviewRequest);
      }),
    close: () => {
      worker?.terminate();
      worker = undefined;
      failAll('the page was closed');
    }
  };
}
