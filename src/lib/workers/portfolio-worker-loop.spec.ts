import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

/**
 * The loop of the portfolio's workers, driven in this thread: `self` is a stand-in that records what the loop
 * posts, and the reader is replaced by one whose reads end when the test says so. What must hold: requests are
 * read and answered one after another (a request sent during a read-ahead does not read beside it), answers
 * keep their order, and a read-ahead's storing of the read model waits until the request after it is answered.
 */
const reader = vi.hoisted(() => ({
  reads: [] as { databaseName: string; finish: (fail?: Error) => void }[],
  inFlight: 0,
  mostInFlight: 0,
  persisted: [] as number[]
}));

vi.mock('../storage/portfolio-reader', () => ({
  readPortfolio: (databaseName: string) =>
    new Promise((resolve, reject) => {
      const n = reader.reads.length + 1;
      reader.inFlight += 1;
      reader.mostInFlight = Math.max(reader.mostInFlight, reader.inFlight);
      reader.reads.push({
        databaseName,
        finish: (fail) => {
          reader.inFlight -= 1;
          if (fail) reject(fail);
          else
            resolve({
              records: { read: n },
              persist: async () => {
                reader.persisted.push(n);
              }
            });
        }
      });
    })
}));

interface Posted {
  id: number;
  type: string;
  read?: number;
  message?: string;
}
let posted: Posted[];
let send: (request: object) => void;

beforeEach(async () => {
  vi.resetModules();
  reader.reads = [];
  reader.inFlight = 0;
  reader.mostInFlight = 0;
  reader.persisted = [];
  posted = [];
  const scope: { postMessage: (m: Posted) => void; onmessage?: (e: { data: object }) => void } = {
    postMessage: (m) => posted.push(m)
  };
  vi.stubGlobal('self', scope);
  const { servePortfolioRequests } = await import('./portfolio-worker-loop');
  servePortfolioRequests((records) => ({ read: (records as unknown as { read: number }).read }));
  send = (request) => scope.onmessage?.({ data: request });
});
afterEach(() => vi.unstubAllGlobals());

/** Lets every settled promise run its callbacks. */
const settle = () => new Promise((resolve) => setTimeout(resolve, 0));

describe('the portfolio workers’ loop', () => {
  it('answers a request sent during a read-ahead after it, reading once at a time, in order', async () => {
    send({ id: 1, databaseName: 'db', reload: true, readAhead: true });
    send({ id: 2, databaseName: 'db', reload: true, ask: 'rank' });
    await settle();
    expect(reader.reads).toHaveLength(1);
    reader.reads[0]!.finish();
    await settle();
    expect(reader.reads).toHaveLength(2);
    expect(posted.map((p) => [p.id, p.type])).toEqual([[1, 'done']]);
    // The read-ahead's storing waits for the request it read for.
    expect(reader.persisted).toEqual([]);
    reader.reads[1]!.finish();
    await settle();
    expect(posted.map((p) => [p.id, p.type, p.read])).toEqual([
      [1, 'done', undefined],
      [2, 'done', 2]
    ]);
    expect(reader.mostInFlight).toBe(1);
    // The request's own read stores the model once it is answered; the read-ahead's is not run beside it.
    expect(reader.persisted).toEqual([2]);
  });

  it('runs a read-ahead’s storing after the next request when that request read nothing itself', async () => {
    send({ id: 1, databaseName: 'db', reload: true, readAhead: true });
    send({ id: 2, databaseName: 'db', reload: false, ask: 'rank' });
    await settle();
    reader.reads[0]!.finish();
    await settle();
    expect(reader.reads).toHaveLength(1);
    expect(posted.map((p) => [p.id, p.read])).toEqual([
      [1, undefined],
      [2, 1]
    ]);
    expect(reader.persisted).toEqual([1]);
  });

  it('answers a failed read-ahead with its error and still serves the request after it', async () => {
    send({ id: 1, databaseName: 'db', reload: true, readAhead: true });
    send({ id: 2, databaseName: 'db', reload: true, ask: 'rank' });
    await settle();
    reader.reads[0]!.finish(new Error('The database could not be opened'));
    await settle();
    reader.reads[1]!.finish();
    await settle();
    expect(posted).toEqual([
      { id: 1, type: 'error', message: 'The database could not be opened' },
      expect.objectContaining({ id: 2, type: 'done', read: 2 })
    ]);
    expect(reader.persisted).toEqual([2]);
  });
});
