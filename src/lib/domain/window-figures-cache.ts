import { WindowFigureColumns } from './window-figure-columns';

/** Windows kept: ten review quarters and a few portfolio windows, with room for a step back and forth. */
const WINDOWS = 16;

/**
 * Windows computed once per characteristic and kept while its studies do not change: ranking a record set read
 * again (a study written elsewhere in the portfolio), or opening another quarter, then costs only the judging and
 * the sort. Kept per window (first and last month) as columns over the read model's rows
 * (window-figure-columns.ts), in which each row carries what it was computed from — the characteristic's
 * revision and the row's stamp — so that a row is computed again only when its characteristic or its studies
 * changed. The windows asked for most recently are kept; a cache asked about another model starts afresh (a model
 * rebuilt numbers its rows anew).
 */
export class WindowFiguresCache {
  #model: object | undefined;
  #windows = new Map<number, WindowFigureColumns>();

  /** Rows holding a window, over every window kept. */
  get size(): number {
    let size = 0;
    for (const w of this.#windows.values()) size += w.size;
    return size;
  }

  /** Windows computed so far into the windows kept (one computed again counts again): for tests. */
  get computed(): number {
    let computed = 0;
    for (const w of this.#windows.values()) computed += w.computed;
    return computed;
  }

  clear(): void {
    this.#windows = new Map();
  }

  /** The columns of the window from month `first` to month `end` over `model` (made empty the first time). */
  columns(model: object, first: number, end: number): WindowFigureColumns {
    if (model !== this.#model) {
      this.clear();
      this.#model = model;
    }
    const key = first * 100_000 + (end - first);
    let kept = this.#windows.get(key);
    if (kept) {
      // Most recently asked for last: the first in the map is the one to drop.
      this.#windows.delete(key);
    } else {
      if (this.#windows.size >= WINDOWS) this.#windows.delete(this.#windows.keys().next().value!);
      kept = new WindowFigureColumns(first, end);
    }
    this.#windows.set(key, kept);
    return kept;
  }
}
