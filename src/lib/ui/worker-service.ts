import { appendPart, type AnswerPart } from '../workers/answer-parts';
/**
 * A background worker that lives as long as a page and answers requests in the order they were made — for
 * work whose worker keeps something between requests (the ranking's window figures, the records it read).
 * One-off jobs use worker-job.ts instead. The worker starts on the first request or on `start` (never while a
 * page is prerendered); `close` ends it when the page goes. Messages carry an `id`; an answer `{ id, type:
 * 'error', message }` rejects its request with `failed` before the message.
 */
export interface WorkerService<Request, Answer> {
  ask: (request: Request) => Promise<Answer>;
  /** Starts the worker now, ahead of its first request, so that its code loads while the page gets ready. */
  start: () => void;
  close: () => void;
}

export function workerService<Request extends object, Answer extends { id: number; type: string }>(
  /** `() => new Worker(new URL('…', import.meta.url), { type: 'module' })`, written out where it is used. */
  create: () => Worker,
  failed: string
): WorkerService<Request, Answer> {
  let worker: Worker | undefined;
  let next = 0;
  const waiting = new Map<number, { resolve: (a: Answer) => void; reject: (e: Error) => void }>();
  /** Parts of long lists received ahead of their answers (workers/answer-parts.ts). */
  const parts = new Map<number, AnswerPart[]>();
  const failAll = (message: string) => {
    for (const w of waiting.values()) w.reject(new Error(`${failed}: ${message}`));
    waiting.clear();
    parts.clear();
  };
  const launch = (): Worker => {
    const w = create();
    w.onmessage = (
      event: MessageEvent<Answer | AnswerPart | { id: number; type: 'error'; message: string }>
    ) => {
      // Read here, in a task of its own: reading a message copies it in.
      const m = event.data;
      if (m.type === 'part' && 'path' in m) {
        if (!waiting.has(m.id)) return;
        const kept = parts.get(m.id);
        if (kept) kept.push(m);
        else parts.set(m.id, [m]);
        return;
      }
      const asked = waiting.get(m.id);
      waiting.delete(m.id);
      const received = parts.get(m.id) ?? [];
      parts.delete(m.id);
      if (!asked) return;
      if (m.type === 'error' && 'message' in m) {
        asked.reject(new Error(`${failed}: ${m.message}`));
        return;
      }
      for (const part of received) appendPart(m, part);
      // Answered in a task of its own: copying a large answer in (2 000 ranked rows) and the page's acting on it
      // were one task of 0.2–0.3 s at company size on a slow machine.
      setTimeout(() => asked.resolve(m as Answer), 0);
    };
    w.onerror = (event) => {
      failAll(event.message || 'the background worker stopped');
      worker = undefined;
    };
    return w;
  };
  return {
    ask: (request) =>
      new Promise((resolve, reject) => {
        worker ??= launch();
        next += 1;
        waiting.set(next, { resolve, reject });
        worker.postMessage({ ...request, id: next });
      }),
    start: () => {
      worker ??= launch();
    },
    close: () => {
      worker?.terminate();
      worker = undefined;
      failAll('the page was closed');
    }
  };
}
