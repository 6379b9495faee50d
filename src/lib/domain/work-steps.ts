/**
 * Long computations written as generators that pause now and then (`yield`), so that one rule has one home
 * whether it runs at once (the command line, tests: runToEnd) or in slices between a page's other tasks
 * (storage/sliced-run.ts): merging a company's file on the page's thread would otherwise hold it for a second.
 */
export type Steps<T> = Generator<void, T, void>;

/** Runs a stepped computation to its end without pausing. */
export function runToEnd<T>(steps: Steps<T>): T {
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
  }
}

/**
 * A counter that answers true once every `every` calls: where a loop may pause. Pausing per record would cost a
 * generator round trip each; a few hundred records take well under a millisecond.
 */
export function pauseEvery(every = 256): () => boolean {
  let count = 0;
  return () => {
    count += 1;
    if (count < every) return false;
    count = 0;
    return true;
  };
}
