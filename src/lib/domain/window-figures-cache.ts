import type { JudgeInput } from './judge-input';

/** Windows kept per characteristic: ten review quarters and a few portfolio windows. */
const PER_CHARACTERISTIC = 24;
/** Entries in all; beyond it the cache starts again (characteristics deleted or reloaded under new ids). */
const TOTAL = 500_000;

/**
 * Windows judged once per characteristic and kept while its studies do not change: re-judging after a new
 * record set (a study written elsewhere in the portfolio), or opening another quarter, then costs only the
 * comparison and the sort. A window is found by the characteristic's row in the read model (rows never move in a
 * model) and its key (judge-input.ts WindowKey): the characteristic's revision, the window's months and the row's
 * stamp, compared as numbers, not joined into a string. The window is kept as the ranking judges it, with its key
 * in it: one object per window. Kept per row in an array (or alone, as most rows keep one window), not in a map
 * by the characteristic's id: at company size the lookup by id string was a tenth of a first ranking. A cache
 * asked about another model starts afresh (a model rebuilt numbers its rows anew).
 */
export class WindowFiguresCache {
  #model: object | undefined;
  #byRow: (JudgeInput | JudgeInput[] | undefined)[] = [];
  #size = 0;

  get size(): number {
    return this.#size;
  }

  clear(): void {
    this.#byRow = [];
    this.#size = 0;
  }

  get(
    model: object,
    row: number,
    rev: number,
    first: number,
    end: number,
    rowStamp: number
  ): JudgeInput | undefined {
    if (model !== this.#model) return undefined;
    const kept = this.#byRow[row];
    if (!kept) return undefined;
    if (!Array.isArray(kept)) return sameWindow(kept, rev, first, end, rowStamp) ? kept : undefined;
    for (const w of kept) if (sameWindow(w, rev, first, end, rowStamp)) return w;
    return undefined;
  }

  /** Keeps `window` (as given, found by the key it carries) for this row; returns it. */
  set(model: object, row: number, window: JudgeInput): JudgeInput {
    if (model !== this.#model) {
      this.clear();
      this.#model = model;
    }
    if (this.#size >= TOTAL) this.clear();
    const byRow = this.#byRow;
    // Filled up to the row first: windows come in the order of the processes (by id), not of the model's rows,
    // and an array written far past its end is kept as a dictionary, where every lookup hashes.
    while (byRow.length <= row) byRow.push(undefined);
    const kept = byRow[row];
    if (!kept) {
      byRow[row] = window;
      this.#size += 1;
    } else if (!Array.isArray(kept)) {
      byRow[row] = [kept, window];
      this.#size += 1;
    } else if (kept.length < PER_CHARACTERISTIC) {
      kept.push(window);
      this.#size += 1;
    } else {
      // Windows of edited studies pile up otherwise: the oldest of this characteristic goes.
      kept.shift();
      kept.push(window);
    }
    return window;
  }

  /** Puts `window` where `old` was kept for this row (the same key: a record reloaded under the same revision). */
  replace(row: number, old: JudgeInput, window: JudgeInput): void {
    const kept = this.#byRow[row];
    if (kept === old) this.#byRow[row] = window;
    else if (Array.isArray(kept)) {
      const at = kept.indexOf(old);
      if (at >= 0) kept[at] = window;
    }
  }
}

function sameWindow(w: JudgeInput, rev: number, first: number, end: number, rowStamp: number): boolean {
  return w.rowStamp === rowStamp && w.first === first && w.end === end && w.rev === rev;
}
