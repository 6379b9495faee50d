import { flushSync, untrack } from 'svelte';
import { inTurn } from './chart-turns';

/** A value as each part of a page shows it (valueInTurns). */
export interface ValueInTurns<T> {
  /** The value part `i` shows now. */
  at(i: number): T;
  /** Whether part `i` still shows a value before the latest (for aria-busy). */
  busy(i: number): boolean;
}

/**
 * One value shown by several parts of a page, each part taking a new value in a task of its own (in turns,
 * ui/chart-turns.ts), in order: another quarter chosen on the quarterly review changed every section at once,
 * and at 2 000 processes with the CPU throttled 4× that update and the page's layout after it were tasks of
 * 60–90 ms, now and then over 100. The first value other than undefined is every part's at once (the parts draw
 * themselves in turns the first time: ReviewSection), and so is undefined. Until its turn a part shows the value
 * before, as a chart waiting for its turn shows its drawing before (ChartPanel). Printing takes the latest
 * everywhere at once. Call it while a component is being set up (it makes an effect).
 */
export function valueInTurns<T>(value: () => T, parts: number): ValueInTurns<T> {
  let shown = $state.raw<T[] | undefined>(undefined);
  const latest = $derived(value());
  $effect(() => {
    const next = latest;
    const before = untrack(() => shown);
    // Nothing shown yet (or nothing to show): every part at once.
    if (next === undefined || before === undefined || before.every((v) => v === undefined)) {
      shown = Array.from({ length: parts }, () => next);
      return;
    }
    let gone = false;
    const take = (i: number) => {
      const now = untrack(() => shown) ?? before;
      shown = now.map((v, k) => (k === i ? next : v));
    };
    for (let i = 0; i < parts; i += 1)
      void inTurn(() => {
        if (!gone) take(i);
      });
    const takeAll = () => flushSync(() => (shown = Array.from({ length: parts }, () => next)));
    window.addEventListener('beforeprint', takeAll);
    return () => {
      gone = true;
      window.removeEventListener('beforeprint', takeAll);
    };
  });
  return {
    at: (i) => shown?.[i] ?? latest,
    busy: (i) => shown !== undefined && shown[i] !== latest
  };
}
