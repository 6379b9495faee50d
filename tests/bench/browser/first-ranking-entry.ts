/**
 * Runs in a dedicated worker of headless Chromium (bundled by browser-bench.ts), as the app's portfolio ranking
 * does (workers/portfolio-ranking.worker.ts): given a number of processes, generates that portfolio, then times
 * its first ranking against the typed-array baseline in this same worker (ranking-scale.ts) and posts the times.
 */
import { firstRankingInThisProcess } from '../ranking-scale';

const scope = self as unknown as {
  onmessage: ((e: MessageEvent<number>) => void) | null;
  postMessage: (message: unknown) => void;
};
scope.onmessage = (e) => scope.postMessage(firstRankingInThisProcess(e.data));
