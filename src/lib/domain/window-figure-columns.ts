import type { WindowFigures } from './window-figures';

/** Figures' kinds by code (code 0: the window has no figures). */
const KINDS: readonly WindowFigures['kind'][] = ['measured', 'summary', 'defectives', 'defects'];

/** The per-unit figures a window is judged on (portfolio-ranking perUnitInto); a bound not known is undefined. */
export interface PerUnitFigures {
  z: number;
  zBound: number | undefined;
  fraction: number;
  fractionBound: number | undefined;
}

/** What judging reads of a window's figures (portfolio-ranking judgeFigures), as an object a ranking reuses. */
export interface JudgedFigures {
  kind: WindowFigures['kind'];
  cpk?: number | undefined;
  ppk?: number | undefined;
  cpkLower?: number | undefined;
  ppkLower?: number | undefined;
  stable?: boolean | undefined;
}

/**
 * An object type with every field required, those that may be left out given as possibly undefined (mapped over
 * the names as strings, so that no field keeps its `?`).
 */
type Complete<T> = { [K in Extract<keyof T, string>]: T[K] };

/** The fields of an object type whose values are numbers (where present). */
type NumberFields<T> = { [K in keyof T]-?: NonNullable<T[K]> extends number ? K : never }[keyof T];

/**
 * Every number a row holds, in the order it holds them: each number field of WindowFigures, then the per-unit
 * figures. The one list of them — written as objects with every field, so that the compiler refuses a list that
 * misses one, and read everywhere below through it.
 */
const FIGURE_FIELDS: Record<NumberFields<WindowFigures>, true> = {
  n: true,
  yield: true,
  zLevel: true,
  mean: true,
  sdOverall: true,
  sdWithin: true,
  cpk: true,
  ppk: true,
  p: true,
  dpu: true,
  dpmo: true,
  ppmTotal: true,
  cpkLower: true,
  ppkLower: true,
  zLevelLower: true,
  fractionUpper: true,
  dpuUpper: true
};
const UNIT_FIELDS: Record<keyof PerUnitFigures, true> = {
  z: true,
  zBound: true,
  fraction: true,
  fractionBound: true
};

type FigureField = NumberFields<WindowFigures>;
const FIGURES = Object.keys(FIGURE_FIELDS) as FigureField[];
const UNITS = Object.keys(UNIT_FIELDS) as (keyof PerUnitFigures)[];
/** Numbers per row. */
const STRIDE = FIGURES.length + UNITS.length;
/** Each figure's place in a row. */
const SLOT = Object.fromEntries(FIGURES.map((f, i) => [f, i])) as Record<FigureField, number>;
const YIELD = SLOT.yield;
const CPK = SLOT.cpk;
const PPK = SLOT.ppk;
const CPK_LOWER = SLOT.cpkLower;
const PPK_LOWER = SLOT.ppkLower;
const Z = FIGURES.length + UNITS.indexOf('z');
const Z_BOUND = FIGURES.length + UNITS.indexOf('zBound');
const FRACTION = FIGURES.length + UNITS.indexOf('fraction');
const FRACTION_BOUND = FIGURES.length + UNITS.indexOf('fractionBound');

/** Model names met so far, by code: a handful in any portfolio. */
const modelNames: string[] = [];
const modelCodes = new Map<string, number>();

function modelCode(model: string): number {
  let code = modelCodes.get(model);
  if (code === undefined) {
    code = modelNames.push(model) - 1;
    modelCodes.set(model, code);
  }
  return code;
}

/** A figure as a row holds it: NaN for undefined (a row holding a NaN of its own is also kept as the object). */
const put = (v: number | undefined) => (v === undefined ? NaN : v);
/** A row's number as the figure: undefined for NaN. */
const got = (v: number) => (v === v ? v : undefined);

/**
 * One window (its first and last month, portfolio-index monthOrdinal) of every characteristic of a read model,
 * by the characteristic's row in the model (rows never move in a model): each row's window figures
 * (WindowFigures, field by field), what judging reads beside them (its months, whether the limits changed within
 * it, the badges of its figures, the per-unit figures), and what it was computed from — the characteristic's
 * revision and the row's stamp (MonthlyStatistics rowStamp) — so that a ranking of a record set read again, or
 * of the next quarter, finds it.
 *
 * In typed arrays, not an object per window: at company size the objects a first ranking kept per window (its
 * figures, its judging input, its cache entry) and per process cost it a tenth of its time warm and the peak some
 * 30 MB; a row's objects are built again from here (figuresAt) only for the rows someone looks at. A row's numbers
 * lie side by side (FIGURE_FIELDS, then the per-unit figures), as judging reads them.
 *
 * A figure not known is NaN. A window whose numbers hold a NaN of their own, which could not be told from "not
 * known", is also kept as the object (keptAt), so that every window reads back exactly as computed.
 */
export class WindowFigureColumns {
  readonly first: number;
  readonly end: number;
  /** Windows computed into these columns so far (a window computed again counts again): for tests. */
  computed = 0;
  #capacity = 0;
  #kept = new Map<number, WindowFigures>();
  /** What each row's window was computed from; NaN for a row without one. */
  #rev = new Float64Array(0);
  #stamp = new Float64Array(0);
  #numbers = new Float64Array(0);
  /** KINDS position + 1; 0 where the window has no figures. */
  #kind = new Uint8Array(0);
  #model = new Uint16Array(0);
  /** −1: not checked; 0: not stable; 1: stable. */
  #stable = new Int8Array(0);
  #months = new Int32Array(0);
  #limitsChanged = new Uint8Array(0);
  #badgeMask = new Uint8Array(0);

  constructor(first: number, end: number) {
    this.first = first;
    this.end = end;
  }

  /** Rows holding a window. */
  get size(): number {
    let size = 0;
    for (let r = 0; r < this.#capacity; r += 1) if (this.#rev[r] === this.#rev[r]) size += 1;
    return size;
  }

  /** Room for `rows` rows (a model only adds rows). */
  ensure(rows: number): void {
    if (rows <= this.#capacity) return;
    const capacity = Math.max(rows, Math.ceil(this.#capacity * 1.5));
    const grow = <T extends Float64Array | Uint8Array | Uint16Array | Int8Array | Int32Array>(
      a: T,
      make: (n: number) => T,
      size = capacity
    ) => {
      const b = make(size);
      b.set(a);
      return b;
    };
    const keys = (a: Float64Array<ArrayBuffer>) =>
      grow(a, (n) => {
        const b = new Float64Array(n);
        b.fill(NaN, a.length);
        return b;
      });
    this.#rev = keys(this.#rev);
    this.#stamp = keys(this.#stamp);
    this.#numbers = grow(this.#numbers, (n) => new Float64Array(n), capacity * STRIDE);
    this.#kind = grow(this.#kind, (n) => new Uint8Array(n));
    this.#model = grow(this.#model, (n) => new Uint16Array(n));
    this.#stable = grow(this.#stable, (n) => new Int8Array(n));
    this.#months = grow(this.#months, (n) => new Int32Array(n));
    this.#limitsChanged = grow(this.#limitsChanged, (n) => new Uint8Array(n));
    this.#badgeMask = grow(this.#badgeMask, (n) => new Uint8Array(n));
    this.#capacity = capacity;
  }

  /** Whether row `row` holds the window of this revision as computed at this row stamp. */
  holds(row: number, rev: number, stamp: number): boolean {
    return row < this.#capacity && this.#rev[row] === rev && this.#stamp[row] === stamp;
  }

  /**
   * Writes a row's window: its figures (undefined for none), months, whether the limits changed within it, and
   * what judging reads beside them (`unit` when there are figures, `badgeMask`), under its key (`rev`, `stamp`).
   */
  write(
    row: number,
    rev: number,
    stamp: number,
    figures: WindowFigures | undefined,
    months: number,
    limitsChanged: boolean,
    unit: PerUnitFigures | undefined,
    badgeMask: number
  ): void {
    this.ensure(row + 1);
    this.computed += 1;
    this.#rev[row] = rev;
    this.#stamp[row] = stamp;
    this.#months[row] = months;
    this.#limitsChanged[row] = limitsChanged ? 1 : 0;
    this.#badgeMask[row] = badgeMask;
    this.#kept.delete(row);
    if (!figures) {
      this.#kind[row] = 0;
      return;
    }
    this.#kind[row] = KINDS.indexOf(figures.kind) + 1;
    this.#model[row] = modelCode(figures.model);
    this.#stable[row] = figures.stable === undefined ? -1 : figures.stable ? 1 : 0;
    const numbers = this.#numbers;
    const at = row * STRIDE;
    let ownNaN = false;
    for (let i = 0; i < FIGURES.length; i += 1) {
      const v = figures[FIGURES[i]!];
      if (v !== v) ownNaN = true;
      numbers[at + i] = put(v);
    }
    for (let i = 0; i < UNITS.length; i += 1) {
      const v = unit![UNITS[i]!];
      if (v !== v) ownNaN = true;
      numbers[at + FIGURES.length + i] = put(v);
    }
    if (ownNaN) this.#kept.set(row, figures);
  }

  /** Whether a row's window has figures. */
  hasFigures(row: number): boolean {
    return this.#kind[row] !== 0;
  }

  /** A row's number (a figure of WindowFigures): NaN where not known. */
  numberAt(row: number, field: FigureField): number {
    return this.#numbers[row * STRIDE + SLOT[field]]!;
  }

  /** A row's yield (its window has figures). */
  yieldAt(row: number): number {
    return this.#numbers[row * STRIDE + YIELD]!;
  }

  monthsAt(row: number): number {
    return this.#months[row]!;
  }

  limitsChangedAt(row: number): boolean {
    return this.#limitsChanged[row] === 1;
  }

  badgeMaskAt(row: number): number {
    return this.#badgeMask[row]!;
  }

  /** The figures of a row whose own NaN the columns cannot carry (see the class), or undefined. */
  keptAt(row: number): WindowFigures | undefined {
    return this.#kept.size === 0 ? undefined : this.#kept.get(row);
  }

  /**
   * What judging reads of a row's window (which has figures, and none kept as an object: keptAt), written into
   * the objects given — a ranking judges every row with the same two.
   */
  readJudged(row: number, figures: JudgedFigures, unit: PerUnitFigures): void {
    const numbers = this.#numbers;
    const at = row * STRIDE;
    figures.kind = KINDS[this.#kind[row]! - 1]!;
    figures.cpk = got(numbers[at + CPK]!);
    figures.ppk = got(numbers[at + PPK]!);
    figures.cpkLower = got(numbers[at + CPK_LOWER]!);
    figures.ppkLower = got(numbers[at + PPK_LOWER]!);
    const stable = this.#stable[row]!;
    figures.stable = stable < 0 ? undefined : stable === 1;
    unit.z = numbers[at + Z]!;
    unit.zBound = got(numbers[at + Z_BOUND]!);
    unit.fraction = numbers[at + FRACTION]!;
    unit.fractionBound = got(numbers[at + FRACTION_BOUND]!);
  }

  /**
   * A row's window figures as computed (undefined for none): one object, built on each call, as one literal with
   * every field (typed so that the compiler refuses one left out): an object given its fields one by one by name
   * took a review's rows three times as long while the code was new.
   */
  figuresAt(row: number): WindowFigures | undefined {
    const code = this.#kind[row]!;
    if (code === 0) return undefined;
    const kept = this.keptAt(row);
    if (kept) return kept;
    const stable = this.#stable[row]!;
    const numbers = this.#numbers;
    const at = row * STRIDE;
    const figures: Complete<WindowFigures> = {
      kind: KINDS[code - 1]!,
      n: numbers[at + SLOT.n]!,
      mean: got(numbers[at + SLOT.mean]!),
      sdOverall: got(numbers[at + SLOT.sdOverall]!),
      sdWithin: got(numbers[at + SLOT.sdWithin]!),
      cpk: got(numbers[at + SLOT.cpk]!),
      ppk: got(numbers[at + SLOT.ppk]!),
      p: got(numbers[at + SLOT.p]!),
      dpu: got(numbers[at + SLOT.dpu]!),
      dpmo: got(numbers[at + SLOT.dpmo]!),
      ppmTotal: got(numbers[at + SLOT.ppmTotal]!),
      yield: numbers[at + SLOT.yield]!,
      zLevel: numbers[at + SLOT.zLevel]!,
      model: modelNames[this.#model[row]!]!,
      stable: stable < 0 ? undefined : stable === 1,
      cpkLower: got(numbers[at + SLOT.cpkLower]!),
      ppkLower: got(numbers[at + SLOT.ppkLower]!),
      zLevelLower: got(numbers[at + SLOT.zLevelLower]!),
      fractionUpper: got(numbers[at + SLOT.fractionUpper]!),
      dpuUpper: got(numbers[at + SLOT.dpuUpper]!)
    };
    return figures;
  }
}
