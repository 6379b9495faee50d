import { describe, expect, it } from 'vitest';
import { pauseEvery, runToEnd, type Steps } from './work-steps';

function* countTo(n: number): Steps<number> {
  const pause = pauseEvery(10);
  let sum = 0;
  for (let i = 1; i <= n; i += 1) {
    if (pause()) yield;
    sum += i;
  }
  return sum;
}

describe('stepped work', () => {
  it('runs to the same end at once as step by step', () => {
    expect(runToEnd(countTo(1000))).toBe(500500);
    const steps = countTo(1000);
    let pauses = 0;
    let step = steps.next();
    while (!step.done) {
      pauses += 1;
      step = steps.next();
    }
    expect(step.value).toBe(500500);
    // Once every ten records: a thousand records pause a hundred times.
    expect(pauses).toBe(100);
  });

  it('pauses once every so many calls, starting again after each pause', () => {
    const pause = pauseEvery(3);
    expect(Array.from({ length: 7 }, () => pause())).toEqual([false, false, true, false, false, true, false]);
  });
});
