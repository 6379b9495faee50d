import { flushSync, untrack } from 'svelte';
import { inTurn } from './chart-turns';

/** How many rows of a list to draw now, and whether more are still to come (RowsInTurns). */
export interface RowsInTurns {
  /** `step` in the first drawing of a list, `step` more in each turn after, then Infinity. */
  readonly count: number;
  /** True while the rows wanted are not all drawn (for aria-busy). */
  readonly busy: boolean;
}

/**
 * A long list drawn a few rows per task (in turns, ui/chart-turns.ts), starting again with each new list: at
 * 2 000 processes with the CPU throttled 4×, a table row took some 5 ms to create, and a view of them drawn in
 * one task with the page around it — then laid out in the next — were the pages' longest tasks. `list` gives the
 * list (a new value starts again), `wanted` how many rows the page wants drawn (read when a turn comes).
 * Printing draws them all at once, as the review's sections are (a report printed early has every row). Call it
 * while a component is being set up (it makes an effect).
 */
export function rowsInTurns(list: () => unknown, wanted: () => number, step: number): RowsInTurns {
  let grown = $state.raw<{ list: unknown; count: number } | undefined>(undefined);
  const count = $derived(grown !== undefined && grown.list === list() ? grown.count : step);
  $effect(() => {
    const current = list();
    let gone = false;
    const grow = (from: number): void => {
      void inTurn(() => {
        if (gone) return;
        const next = from + step;
        const done = next >= untrack(wanted);
        grown = { list: current, count: done ? Infinity : next };
        if (!done) grow(next);
      });
    };
    grow(step);
    const drawAll = () => flushSync(() => (grown = { list: current, count: Infinity }));
    window.addEventListener('beforeprint', drawAll);
    return () => {
      gone = true;
      window.removeEventListener('beforeprint', drawAll);
    };
  });
  return {
    get count() {
      return count;
    },
    get busy() {
      return count !== Infinity;
    }
  };
}
