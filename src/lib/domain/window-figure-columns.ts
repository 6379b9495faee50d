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

/** A figure that may be unknown, as a column holds it: NaN for undefined. */
const put = (v: number | undefined) => (v === undefined ? NaN : v);
/** A column's value as the figure: undefined for NaN. */
const got = (v: number) => (v === v ? v : undefined);

/**
 * One window (its first and last month, portfolio-index monthOrdinal) of every characteristic of a read model,
 * by the characteristic's row in the model (rows never move in a model): each row's window figures
 * (WindowFigures, field by field), what judging reads beside them (its months, whether the limits changed within
 * it, the badges of its figures, the per-unit figures), and what it was computed from — the characteristic's
 * revision and the row's stamp (MonthlyStatistics rowStamp) — so that a ranking of a record set read again, or
 * of the next quarter, finds it.
 *
 * Columns, not an object per window: at company size the objects a first ranking kept per window (its figures,
 * its judging input, its cache entry) were a third of the ranking's time, most of it the garbage collector
 * copying them; a row's objects are built again from here (figuresAt) only for the rows someone looks at.
 *
 * A figure not known is NaN in its column. A window whose figures (or per-unit bounds) hold a NaN of their own,
 * which a column could not tell from "not known", is also kept as the object (keptAt), so that every window reads
 * back exactly as computed.
 */
export class WindowFigureColumns {
  readonly first: number;
  readonly end: number;
  /** Windows computed into these columns so far (a window computed again counts again): for tests. */
  computed = 0;
  #capacity = 0;
  #kept = new Map<number, WindowFigures>();

  /** What each row's window was computed from; NaN for a row without one. */
  rev = new Float64Array(0);
  stamp = new Float64Array(0);
  months = new Int32Array(0);
  limitsChanged = new Uint8Array(0);
  badgeMask = new Uint8Array(0);
  z = new Float64Array(0);
  zBound = new Float64Array(0);
  fraction = new Float64Array(0);
  fractionBound = new Float64Array(0);
  /** KINDS position + 1; 0 where the window has no figures. */
  kind = new Uint8Array(0);
  n = new Float64Array(0);
  yield = new Float64Array(0);
  zLevel = new Float64Array(0);
  mean = new Float64Array(0);
  sdOverall = new Float64Array(0);
  sdWithin = new Float64Array(0);
  cpk = new Float64Array(0);
  ppk = new Float64Array(0);
  p = new Float64Array(0);
  dpu = new Float64Array(0);
  dpmo = new Float64Array(0);
  ppmTotal = new Float64Array(0);
  cpkLower = new Float64Array(0);
  ppkLower = new Float64Array(0);
  zLevelLower = new Float64Array(0);
  fractionUpper = new Float64Array(0);
  dpuUpper = new Float64Array(0);
  model = new Uint16Array(0);
  /** −1: not checked; 0: not stable; 1: stable. */
  stable = new Int8Array(0);

  constructor(first: number, end: number) {
    this.first = first;
    this.end = end;
  }

  /** Rows holding a window. */
  get size(): number {
    let size = 0;
    for (let r = 0; r < this.#capacity; r += 1) if (this.rev[r] === this.rev[r]) size += 1;
    return size;
  }

  /** Room for `rows` rows (a model only adds rows). */
  ensure(rows: number): void {
    if (rows <= this.#capacity) return;
    const capacity = Math.max(rows, Math.ceil(this.#capacity * 1.5));
    const f64 = (a: Float64Array, fill = 0) => {
      const b = new Float64Array(capacity);
      if (fill !== 0) b.fill(fill, a.length);
      b.set(a);
      return b;
    };
    const grow = <T extends Uint8Array | Uint16Array | Int8Array | Int32Array>(
      a: T,
      make: (n: number) => T
    ) => {
      const b = make(capacity);
      b.set(a);
      return b;
    };
    this.rev = f64(this.rev, NaN);
    this.stamp = f64(this.stamp, NaN);
    this.months = grow(this.months, (n) => new Int32Array(n));
    this.limitsChanged = grow(this.limitsChanged, (n) => new Uint8Array(n));
    this.badgeMask = grow(this.badgeMask, (n) => new Uint8Array(n));
    this.z = f64(this.z);
    this.zBound = f64(this.zBound);
    this.fraction = f64(this.fraction);
    this.fractionBound = f64(this.fractionBound);
    this.kind = grow(this.kind, (n) => new Uint8Array(n));
    this.n = f64(this.n);
    this.yield = f64(this.yield);
    this.zLevel = f64(this.zLevel);
    this.mean = f64(this.mean);
    this.sdOverall = f64(this.sdOverall);
    this.sdWithin = f64(this.sdWithin);
    this.cpk = f64(this.cpk);
    this.ppk = f64(this.ppk);
    this.p = f64(this.p);
    this.dpu = f64(this.dpu);
    this.dpmo = f64(this.dpmo);
    this.ppmTotal = f64(this.ppmTotal);
    this.cpkLower = f64(this.cpkLower);
    this.ppkLower = f64(this.ppkLower);
    this.zLevelLower = f64(this.zLevelLower);
    this.fractionUpper = f64(this.fractionUpper);
    this.dpuUpper = f64(this.dpuUpper);
    this.model = grow(this.model, (n) => new Uint16Array(n));
    this.stable = grow(this.stable, (n) => new Int8Array(n));
    this.#capacity = capacity;
  }

  /** Whether row `row` holds the window of this revision as computed at this row stamp. */
  holds(row: number, rev: number, stamp: number): boolean {
    return row < this.#capacity && this.rev[row] === rev && this.stamp[row] === stamp;
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
    this.rev[row] = rev;
    this.stamp[row] = stamp;
    this.months[row] = months;
    this.limitsChanged[row] = limitsChanged ? 1 : 0;
    this.badgeMask[row] = badgeMask;
    this.#kept.delete(row);
    if (!figures) {
      this.kind[row] = 0;
      return;
    }
    this.z[row] = unit!.z;
    this.zBound[row] = put(unit!.zBound);
    this.fraction[row] = unit!.fraction;
    this.fractionBound[row] = put(unit!.fractionBound);
    this.kind[row] = KINDS.indexOf(figures.kind) + 1;
    this.n[row] = figures.n;
    this.yield[row] = figures.yield;
    this.zLevel[row] = figures.zLevel;
    this.mean[row] = put(figures.mean);
    this.sdOverall[row] = put(figures.sdOverall);
    this.sdWithin[row] = put(figures.sdWithin);
    this.cpk[row] = put(figures.cpk);
    this.ppk[row] = put(figures.ppk);
    this.p[row] = put(figures.p);
    this.dpu[row] = put(figures.dpu);
    this.dpmo[row] = put(figures.dpmo);
    this.ppmTotal[row] = put(figures.ppmTotal);
    this.cpkLower[row] = put(figures.cpkLower);
    this.ppkLower[row] = put(figures.ppkLower);
    this.zLevelLower[row] = put(figures.zLevelLower);
    this.fractionUpper[row] = put(figures.fractionUpper);
    this.dpuUpper[row] = put(figures.dpuUpper);
    this.model[row] = modelCode(figures.model);
    this.stable[row] = figures.stable === undefined ? -1 : figures.stable ? 1 : 0;
    if (hasOwnNaN(figures) || isOwnNaN(unit!.zBound) || isOwnNaN(unit!.fractionBound))
      this.#kept.set(row, figures);
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
    figures.kind = KINDS[this.kind[row]! - 1]!;
    figures.cpk = got(this.cpk[row]!);
    figures.ppk = got(this.ppk[row]!);
    figures.cpkLower = got(this.cpkLower[row]!);
    figures.ppkLower = got(this.ppkLower[row]!);
    const stable = this.stable[row]!;
    figures.stable = stable < 0 ? undefined : stable === 1;
    unit.z = this.z[row]!;
    unit.zBound = got(this.zBound[row]!);
    unit.fraction = this.fraction[row]!;
    unit.fractionBound = got(this.fractionBound[row]!);
  }

  /** A row's window figures as computed (undefined for none): one object, built on each call. */
  figuresAt(row: number): WindowFigures | undefined {
    const code = this.kind[row]!;
    if (code === 0) return undefined;
    const kept = this.keptAt(row);
    if (kept) return kept;
    const stable = this.stable[row]!;
    return {
      kind: KINDS[code - 1]!,
      n: this.n[row]!,
      mean: got(this.mean[row]!),
      sdOverall: got(this.sdOverall[row]!),
      sdWithin: got(this.sdWithin[row]!),
      cpk: got(this.cpk[row]!),
      ppk: got(this.ppk[row]!),
      p: got(this.p[row]!),
      dpu: got(this.dpu[row]!),
      dpmo: got(this.dpmo[row]!),
      ppmTotal: got(this.ppmTotal[row]!),
      yield: this.yield[row]!,
      zLevel: this.zLevel[row]!,
      model: modelNames[this.model[row]!]!,
      stable: stable < 0 ? undefined : stable === 1,
      cpkLower: got(this.cpkLower[row]!),
      ppkLower: got(this.ppkLower[row]!),
      zLevelLower: got(this.zLevelLower[row]!),
      fractionUpper: got(this.fractionUpper[row]!),
      dpuUpper: got(this.dpuUpper[row]!)
    };
  }
}

/** Whether a figure that may be undefined is NaN instead (a column would read it back as undefined). */
const isOwnNaN = (v: number | undefined) => v !== undefined && v !== v;

function hasOwnNaN(f: WindowFigures): boolean {
  const isNaN = isOwnNaN;
  return (
    isNaN(f.mean) ||
    isNaN(f.sdOverall) ||
    isNaN(f.sdWithin) ||
    isNaN(f.cpk) ||
    isNaN(f.ppk) ||
    isNaN(f.p) ||
    isNaN(f.dpu) ||
    isNaN(f.dpmo) ||
    isNaN(f.ppmTotal) ||
    isNaN(f.cpkLower) ||
    isNaN(f.ppkLower) ||
    isNaN(f.zLevelLower) ||
    isNaN(f.fractionUpper) ||
    isNaN(f.dpuUpper)
  );
}
