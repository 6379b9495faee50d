import type { Characteristic } from './characteristic';
import type { WindowFigures } from './window-figures';

/** Windows kept per characteristic: ten review quarters and a few portfolio windows. */
const PER_CHARACTERISTIC = 24;
/** Entries in all; beyond it the cache starts again (characteristics deleted or reloaded under new ids). */
const TOTAL = 500_000;

export interface CachedWindow {
  result: WindowFigures | undefined;
  months: number;
}

/** A window kept: its figures, with what finds them (one object per window: there are tens of thousands). */
interface Entry extends CachedWindow {
  rev: number;
  /** The window's first month (portfolio-index monthOrdinal). */
  first: number;
  /** A plain array: a typed array costs some hundred bytes of its own, times every window kept. */
  stamps: number[];
}

/**
 * Window figures computed once per characteristic and kept while its studies do not change: re-judging after a
 * target or weight change, or opening another quarter, then costs only the comparison and the sort. An entry
 * is found by the characteristic's row in the read model (rows never move in a model), its revision, the
 * window's first month, and the stamp of every cell of the window — compared one by one, not joined into a key.
 * Entries are kept per row in an array, not in a map by the characteristic's id: at company size the lookup by
 * id string was a tenth of a first ranking. A cache asked about another model starts afresh (a model rebuilt
 * numbers its rows anew).
 */
export class WindowFiguresCache {
  #model: object | undefined;
  #byRow: (Entry[] | undefined)[] = [];
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
    c: Pick<Characteristic, 'rev'>,
    first: number,
    stamps: ArrayLike<number>
  ): CachedWindow | undefined {
    if (model !== this.#model) return undefined;
    const entries = this.#byRow[row];
    if (!entries) return undefined;
    for (const e of entries) {
      if (e.rev !== c.rev || e.first !== first || e.stamps.length !== stamps.length) continue;
      let same = true;
      for (let i = 0; i < stamps.length && same; i += 1) same = e.stamps[i] === stamps[i];
      if (same) return e;
    }
    return undefined;
  }

  /**
   * `stamps` is kept as given, not copied (the ranking hands over an array it made for the lookup). Returns the
   * window as kept, which `get` gives from then on (the value's fields, not the value).
   */
  set(
    model: object,
    row: number,
    c: Pick<Characteristic, 'rev'>,
    first: number,
    stamps: number[],
    value: CachedWindow
  ): CachedWindow {
    const entry: Entry = { result: value.result, months: value.months, rev: c.rev, first, stamps };
    if (model !== this.#model) {
      this.clear();
      this.#model = model;
    }
    if (this.#size >= TOTAL) this.clear();
    const entries = this.#byRow[row];
    if (!entries) {
      this.#byRow[row] = [entry];
      this.#size += 1;
    } else if (entries.length < PER_CHARACTERISTIC) {
      entries.push(entry);
      this.#size += 1;
    } else {
      // Windows of edited studies pile up otherwise: the oldest entry of this characteristic goes.
      entries.shift();
      entries.push(entry);
    }
    return entry;
  }
}
