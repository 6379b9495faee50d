import { describe, expect, it } from 'vitest';
import { runToEnd, type Steps } from '../domain/work-steps';
import { runInSlices } from './sliced-run';

/** Busy work of `steps` pauses, each after about a millisecond. */
function* busy(steps: number): Steps<number> {
  for (let i = 0; i < steps; i += 1) {
    const until = performance.now() + 1;
    while (performance.now() < until);
    yield;
  }
  return steps;
}

describe('running stepped work in slices', () => {
  it('gives the thread back between slices, so that other tasks run before it ends', async () => {
    let timerRan = false;
    setTimeout(() => (timerRan = true), 0);
    let seenBeforeEnd = false;
    function* watched(): Steps<number> {
      const result = yield* busy(60);
      seenBeforeEnd = timerRan;
      return result;
    }
    await expect(runInSlices(watched(), 10)).resolves.toBe(60);
    expect(seenBeforeEnd).toBe(true);
  });

  it('gives the same result as running at once', async () => {
    expect(await runInSlices(busy(5), 1)).toBe(runToEnd(busy(5)));
  });

  it('passes on a refusal thrown by the work', async () => {
    function* refusing(): Steps<number> {
      yield;
      throw new Error('refused: nothing written');
    }
    await expect(runInSlices(refusing(), 0)).rejects.toThrow('refused: nothing written');
  });
});
