/**
 * One request run in a fresh worker: the way every heavy job of the pages runs (exchange files, measurement
 * files). `handle` reads each message and answers what it means — progress (nothing), a result, or a refusal —
 * and the job settles on the first result or refusal. `cancel` terminates the worker: nothing has been written
 * anywhere, since a job's worker never writes a record (the ranking's derived read model aside,
 * storage/portfolio-reader.ts; a received file is merged by a conversation of its own, exchange-worker-client.ts).
 */
export type WorkerStep<T> = { result: T } | { refused: string } | undefined;

export function workerJob<Request, Message, T>(
  /** `() => new Worker(new URL('…', import.meta.url), { type: 'module' })`, written out where it is used: the
   * bundler finds and builds workers only from that literal form. */
  create: () => Worker,
  request: Request,
  handle: (message: Message) => WorkerStep<T>,
  words: { failed: string; cancelled: string }
): { done: Promise<T>; cancel: () => void } {
  const worker = create();
  let reject: (e: Error) => void = () => undefined;
  const done = new Promise<T>((resolve, rej) => {
    reject = rej;
    worker.onmessage = (event: MessageEvent<Message>) => {
      const step = handle(event.data);
      if (!step) return;
      worker.terminate();
      if ('result' in step) resolve(step.result);
      else rej(new Error(step.refused));
    };
    worker.onerror = (event) => {
      worker.terminate();
      rej(new Error(`${words.failed}: ${event.message || 'the background reader failed'}`));
    };
  });
  worker.postMessage(request);
  return {
    done,
    cancel: () => {
      worker.terminate();
      reject(new Error(words.cancelled));
    }
  };
}
