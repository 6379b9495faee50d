import type { Steps } from '../domain/work-steps';

/** What Chromium offers to give the thread back and continue soon after (absent elsewhere: a timer instead). */
interface TaskScheduler {
  yield?: () => Promise<void>;
}

/** Gives the thread back to the page (input, painting) and resumes in a later task. */
function nextTask(): Promise<void> {
  const scheduler = (globalThis as { scheduler?: TaskScheduler }).scheduler;
  if (scheduler?.yield) return scheduler.yield();
  return new Promise((resolve) => setTimeout(resolve, 0));
}

/**
 * Runs a stepped computation (domain/work-steps.ts) in slices of about `sliceMs` on the caller's thread, giving
 * the thread back between slices: no task of the page lasts much longer than a slice, however large the work.
 */
export async function runInSlices<T>(steps: Steps<T>, sliceMs = 25): Promise<T> {
  let sliceStart = performance.now();
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
    if (performance.now() - sliceStart >= sliceMs) {
      await nextTask();
      sliceStart = performance.now();
    }
  }
}
