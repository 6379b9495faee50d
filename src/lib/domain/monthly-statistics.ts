import { summariseMoments } from '../stats/pooled-moments';
import { compareEdits } from './edit-order';
import { monthOrdinal } from './portfolio-index';
import type { PortfolioRecords } from './portfolio-terms';
import type { Study } from './study';

/** What a cell (one characteristic, one month) holds. */
export const CELL = { empty: 0, raw: 1, summary: 2, defectives: 3, defects: 4 } as const;

const KIND_CODE = {
  raw: CELL.raw,
  summary: CELL.summary,
  defectives: CELL.defectives,
  defects: CELL.defects
};

/** Stamps are unique in the whole program, so a cache keyed by them can never mistake one model's row for another's. */
let nextStamp = 1;

/**
 * The stored form of the read model (storage persists it; see storage/monthly-statistics-store.ts). Raw values
 * are not in it: the cells that need their studies list them in `heldIds`, and the loader reads those studies.
 */
export interface MonthlyStatisticsSnapshot {
  format: 1;
  firstMonth: number;
  span: number;
  /** Characteristic id of each row. */
  rowIds: string[];
  kind: Uint8Array;
  n: Float64Array;
  mean: Float64Array;
  sd: Float64Array;
  units: Float64Array;
  count: Float64Array;
  opportunities: Float64Array;
  tag: Float64Array;
  /** Id of the study each cell shows ('' when empty). */
  ids: string[];
  /** Cells whose studies the model keeps (raw values, or two live studies in one month), with their ids. */
  heldIds: [cell: number, ids: string[]][];
  /** Ids of deleted studies seen (tombstones): with the live ones, every study stored. */
  tombstones: string[];
}

/** A snapshot that may leave the ids out (a model restored from it then waits for attachIds). */
export type SnapshotMaybeWithoutIds = Omit<MonthlyStatisticsSnapshot, 'ids'> &
  Partial<Pick<MonthlyStatisticsSnapshot, 'ids'>>;

type NumberColumns = Pick<
  MonthlyStatisticsSnapshot,
  'n' | 'mean' | 'sd' | 'units' | 'count' | 'opportunities'
>;

const isMeasured = (kind: number) => kind === CELL.raw || kind === CELL.summary;
const isCounted = (kind: number) => kind === CELL.defectives || kind === CELL.defects;

/**
 * Each cell's three numbers, for a compact stored form: n, mean and sd of a measured month, or units, count and
 * opportunities of a counted one — a cell never holds both (see #fill). An empty cell's are 0: nothing reads them.
 */
export function cellNumbersOf(
  snap: Pick<MonthlyStatisticsSnapshot, 'kind'> & NumberColumns
): [Float64Array, Float64Array, Float64Array] {
  const size = snap.kind.length;
  const a = new Float64Array(size);
  const b = new Float64Array(size);
  const c = new Float64Array(size);
  for (let cell = 0; cell < size; cell += 1) {
    const kind = snap.kind[cell]!;
    if (isMeasured(kind)) {
      a[cell] = snap.n[cell]!;
      b[cell] = snap.mean[cell]!;
      c[cell] = snap.sd[cell]!;
    } else if (isCounted(kind)) {
      a[cell] = snap.units[cell]!;
      b[cell] = snap.count[cell]!;
      c[cell] = snap.opportunities[cell]!;
    }
  }
  return [a, b, c];
}

/** The six columns back from cellNumbersOf's three. */
export function columnsOfCellNumbers(
  kind: Uint8Array,
  [a, b, c]: readonly [Float64Array, Float64Array, Float64Array]
): NumberColumns {
  const size = kind.length;
  const out: NumberColumns = {
    n: new Float64Array(size),
    mean: new Float64Array(size),
    sd: new Float64Array(size),
    units: new Float64Array(size),
    count: new Float64Array(size),
    opportunities: new Float64Array(size)
  };
  for (let cell = 0; cell < size; cell += 1) {
    const k = kind[cell]!;
    if (isMeasured(k)) {
      out.n[cell] = a[cell]!;
      out.mean[cell] = b[cell]!;
      out.sd[cell] = c[cell]!;
    } else if (isCounted(k)) {
      out.units[cell] = a[cell]!;
      out.count[cell] = b[cell]!;
      out.opportunities[cell] = c[cell]!;
    }
  }
  return out;
}

/**
 * The portfolio's read model: for each characteristic and month, the sufficient statistics of the study that
 * month shows, in typed arrays laid out row by row (one row per characteristic, one column per month):
 * - measured data: n, mean and sd with n − 1 (raw values summarised once, by Welford's update) — what pooling a
 *   window needs (Chan, Golub & LeVeque) and, with Σ(nᵢ − 1)sᵢ², the pooled within-month sd;
 * - counted data: units, defectives or defects, and opportunities per unit.
 *
 * A ranking pools its windows and its monthly trend from these numbers instead of walking study objects, and the
 * model holds no study object except those whose values a window may need (raw data) — so a worker can keep the
 * model and let the studies go. Updated in place when studies are written, replaced, merged or deleted
 * (`putAll`), and stored between visits (snapshot), so opening a page does not re-read every study.
 *
 * A month with two live studies (a clash kept from before one-study-per-month) shows the newer edit, as
 * `onePerMonth` (study-month.ts) does; the other stays held so it shows again if the newer one is deleted.
 */
export class MonthlyStatistics {
  #rowOf = new Map<string, number>();
  #rowIds: string[] = [];
  #rowCapacity = 0;
  #firstMonth = 0;
  #span = 0;
  #live = 0;
  #tombstones = new Set<string>();
  /** Restored without `ids` (see idsToAttach). */
  #idsToAttach = false;
  kind = new Uint8Array(0);
  n = new Float64Array(0);
  mean = new Float64Array(0);
  sd = new Float64Array(0);
  units = new Float64Array(0);
  count = new Float64Array(0);
  opportunities = new Float64Array(0);
  /**
   * Per row, a number unique to its latest change (0 for none; stamps only grow, in every model of the process):
   * a window's figures stay valid while their row's stamp does. A change in another month of the row counts too,
   * which costs only a recomputation of that characteristic's windows — where a stamp per cell, and an array of
   * them per window kept, cost memory in proportion to every month held.
   */
  rowStamp = new Float64Array(0);
  /** Id of the study each cell shows, and its tag (see putAll; 0 when none was given). */
  ids: (string | undefined)[] = [];
  tag = new Float64Array(0);
  /** The study of a raw cell, or every live study of a month that holds two. */
  held: (Study | Study[] | undefined)[] = [];
  /** Raised by every change. */
  version = 0;

  /** The read model of a set of studies (deleted ones are counted as tombstones). */
  static fromStudies(studies: readonly Study[], tagOf?: (study: Study) => number): MonthlyStatistics {
    const model = new MonthlyStatistics();
    model.#tagOf = tagOf;
    const rowOfStudy = new Int32Array(studies.length).fill(-1);
    const monthOfStudy = new Int32Array(studies.length);
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < studies.length; i += 1) {
      const s = studies[i]!;
      if (s.deletedAt) {
        model.#tombstones.add(s.id);
        continue;
      }
      const m = monthOrdinal(s.period);
      if (m < lo) lo = m;
      if (m > hi) hi = m;
      monthOfStudy[i] = m;
      rowOfStudy[i] = model.#rowFor(s.characteristicId);
    }
    if (model.#rowIds.length === 0) return model;
    model.#reshape(model.#rowIds.length, lo, hi - lo + 1);
    // The first study placed in each cell, so that a second one in the same month can be weighed against it.
    const firstOfCell = new Int32Array(model.#rowIds.length * model.#span).fill(-1);
    for (let i = 0; i < studies.length; i += 1) {
      const row = rowOfStudy[i]!;
      if (row < 0) continue;
      const cell = row * model.#span + (monthOfStudy[i]! - lo);
      const first = firstOfCell[cell]!;
      if (first < 0) firstOfCell[cell] = i;
      model.#place(cell, studies[i]!, first >= 0 ? studies[first] : undefined);
    }
    return model;
  }

  /**
   * The model from its stored form and the studies it holds (`heldIds`; a missing one leaves its cell as stored,
   * without values — the caller should rebuild when `missing` is not empty).
   */
  static fromSnapshot(
    snap: SnapshotMaybeWithoutIds,
    heldStudies: ReadonlyMap<string, Study>
  ): { model: MonthlyStatistics; missing: string[] } {
    const model = new MonthlyStatistics();
    const size = snap.rowIds.length * snap.span;
    model.#rowIds = [...snap.rowIds];
    snap.rowIds.forEach((id, row) => model.#rowOf.set(id, row));
    model.#rowCapacity = snap.rowIds.length;
    model.#firstMonth = snap.firstMonth;
    model.#span = snap.span;
    model.kind = snap.kind.slice(0, size);
    model.n = snap.n.slice(0, size);
    model.mean = snap.mean.slice(0, size);
    model.sd = snap.sd.slice(0, size);
    model.units = snap.units.slice(0, size);
    model.count = snap.count.slice(0, size);
    model.opportunities = snap.opportunities.slice(0, size);
    model.tag = snap.tag.slice(0, size);
    model.rowStamp = new Float64Array(snap.rowIds.length);
    model.ids = new Array<string | undefined>(size);
    model.held = new Array<Study | Study[] | undefined>(size);
    // Without the ids (see attachIds), a cell shows a study exactly when its kind is not empty (#fill, #clear).
    const ids = snap.ids;
    if (!ids) {
      if (snap.heldIds.some(([, held]) => held.length > 1))
        throw new RangeError('A month that holds two studies needs the ids of the studies shown');
      model.#idsToAttach = true;
    }
    for (let cell = 0; cell < size; cell += 1) {
      if (ids ? !ids[cell] : model.kind[cell] === CELL.empty) continue;
      if (ids) model.ids[cell] = ids[cell];
      model.rowStamp[Math.floor(cell / snap.span)] = nextStamp++;
      model.#live += 1;
    }
    const missing: string[] = [];
    for (const [cell, ids] of snap.heldIds) {
      const studies = ids.flatMap((id) => {
        const s = heldStudies.get(id);
        if (!s) missing.push(id);
        return s ? [s] : [];
      });
      model.held[cell] = studies.length > 1 ? studies : studies[0];
      model.#live += ids.length - 1;
    }
    for (const id of snap.tombstones) model.#tombstones.add(id);
    return { model, missing };
  }

  /**
   * Whether the model was restored without the id of the study each cell shows (fromSnapshot without `ids`): a
   * ranking reads no id, so a visit that finds nothing written since never needs them. attachIds gives them;
   * until then the model refuses any change and its full snapshot.
   */
  get idsToAttach(): boolean {
    return this.#idsToAttach;
  }

  /** The ids a restore left out (the snapshot's `ids`, as stored with it). Throws RangeError when they do not fit. */
  attachIds(ids: readonly string[]): void {
    if (!this.#idsToAttach) return;
    const size = this.#rowIds.length * this.#span;
    if (ids.length !== size)
      throw new RangeError(`The stored ids name ${ids.length} cells; the model has ${size}`);
    for (let cell = 0; cell < size; cell += 1)
      if ((this.kind[cell] !== CELL.empty) !== (ids[cell] !== ''))
        throw new RangeError(`The stored ids do not fit the model at cell ${cell}`);
    for (let cell = 0; cell < size; cell += 1) if (ids[cell]) this.ids[cell] = ids[cell];
    this.#idsToAttach = false;
  }

  #requireIds(): void {
    if (this.#idsToAttach) throw new Error('The read model was restored without its ids: attach them first');
  }

  /** The stored form (typed arrays copied, so later changes do not reach it). */
  snapshot(): MonthlyStatisticsSnapshot {
    this.#requireIds();
    const size = this.#rowIds.length * this.#span;
    const ids: string[] = new Array<string>(size);
    for (let cell = 0; cell < size; cell += 1) ids[cell] = this.ids[cell] ?? '';
    return { ...this.snapshotWithoutIds(), ids };
  }

  /** The stored form without the ids (what a model restored without them can give as it is). */
  snapshotWithoutIds(): Omit<MonthlyStatisticsSnapshot, 'ids'> {
    const size = this.#rowIds.length * this.#span;
    const heldIds: [number, string[]][] = [];
    for (let cell = 0; cell < size; cell += 1) {
      const held = this.held[cell];
      if (held) heldIds.push([cell, Array.isArray(held) ? held.map((s) => s.id) : [held.id]]);
    }
    return {
      format: 1,
      firstMonth: this.#firstMonth,
      span: this.#span,
      rowIds: [...this.#rowIds],
      kind: this.kind.slice(0, size),
      n: this.n.slice(0, size),
      mean: this.mean.slice(0, size),
      sd: this.sd.slice(0, size),
      units: this.units.slice(0, size),
      count: this.count.slice(0, size),
      opportunities: this.opportunities.slice(0, size),
      tag: this.tag.slice(0, size),
      heldIds,
      tombstones: [...this.#tombstones]
    };
  }

  get firstMonth(): number {
    return this.#firstMonth;
  }

  get span(): number {
    return this.#span;
  }

  /** Studies the model knows of, live and deleted: what a count of every stored study gives. */
  get known(): number {
    return this.#live + this.#tombstones.size;
  }

  /** The row of a characteristic, or undefined when it has never had a live study here. */
  rowOf(characteristicId: string): number | undefined {
    return this.#rowOf.get(characteristicId);
  }

  /** The record of the study a cell shows, where the model keeps it (raw data, or a month with two). */
  studyAt(cell: number): Study | undefined {
    const held = this.held[cell];
    return Array.isArray(held) ? held.find((s) => s.id === this.ids[cell]) : held;
  }

  /** Index of a cell, or -1 when the month is outside the columns held. */
  cellOf(row: number, month: number): number {
    const col = month - this.#firstMonth;
    return col >= 0 && col < this.#span ? row * this.#span + col : -1;
  }

  /**
   * Adds, replaces or (for deleted ones) removes studies: what storage wrote, replaced, merged or deleted. Each
   * earlier version is found in its characteristic's row; one that is not there (new, or — never done by the app
   * — moved to another characteristic) is looked for in every cell, once per call.
   */
  putAll(batch: readonly Study[], tagOf?: (study: Study) => number): void {
    // A batch may hold several versions of one study (edited twice since the last read): the last one counts.
    // With `tagOf` (a version number the owner keeps, such as storage's write sequence), a study the model
    // shows already with the same tag is unchanged and skipped, so re-reading recent writes costs no figures.
    if (batch.length === 0) return;
    this.#requireIds();
    const latest = new Map<string, Study>();
    for (const s of batch) if (!tagOf || !this.#shows(s, tagOf(s))) latest.set(s.id, s);
    if (!latest.size) return;
    this.version += 1;
    this.#tagOf = tagOf;
    const studies = [...latest.values()];
    const elsewhere = new Set<string>();
    for (const s of studies) {
      this.#tombstones.delete(s.id);
      if (!this.#takeFromRow(s.characteristicId, s.id)) elsewhere.add(s.id);
    }
    if (elsewhere.size) this.#takeEverywhere(elsewhere);
    for (const s of studies) this.#add(s);
  }

  /**
   * Adds studies the model has never seen, without looking for earlier versions: a build in pages (storage reads
   * a large table a page at a time, so that it never holds every study at once). A month that receives a
   * second study it cannot weigh sets `needsRebuild`, as putAll does.
   */
  appendNew(studies: readonly Study[], tagOf?: (study: Study) => number): void {
    if (!studies.length) return;
    this.#requireIds();
    this.version += 1;
    this.#tagOf = tagOf;
    for (const s of studies) this.#add(s);
  }

  #add(s: Study): void {
    if (s.deletedAt) {
      this.#tombstones.add(s.id);
      return;
    }
    const row = this.#rowFor(s.characteristicId);
    if (row >= this.#rowCapacity) this.#reshape(Math.max(16, this.#rowCapacity * 2), ...this.#monthsWith());
    const month = monthOrdinal(s.period);
    if (this.cellOf(row, month) < 0) this.#reshape(this.#rowCapacity, ...this.#monthsWith(month));
    this.#place(this.cellOf(row, month), s);
  }

  /** Whether the cell of the study's month shows it already, with this tag. */
  #shows(study: Study, tag: number): boolean {
    if (!tag || study.deletedAt) return false;
    const row = this.#rowOf.get(study.characteristicId);
    if (row === undefined) return false;
    const cell = this.cellOf(row, monthOrdinal(study.period));
    return cell >= 0 && this.ids[cell] === study.id && this.tag[cell] === tag;
  }

  #tagOf: ((study: Study) => number) | undefined;

  #rowFor(characteristicId: string): number {
    let row = this.#rowOf.get(characteristicId);
    if (row === undefined) {
      row = this.#rowIds.length;
      this.#rowOf.set(characteristicId, row);
      this.#rowIds.push(characteristicId);
    }
    return row;
  }

  /** Shows `study` in its cell; `first` is the record of the study the cell shows already, when known. */
  #place(cell: number, study: Study, first?: Study): void {
    this.#live += 1;
    if (this.ids[cell] === undefined) {
      this.#fill(cell, study);
      return;
    }
    const held = this.held[cell] ?? first;
    if (!held) {
      // A second study in a month whose first is kept only as numbers: which one shows depends on their edit
      // stamps, which the cell does not keep. One live study per month is the rule (a second waits as a month
      // conflict), so this happens only with clashes from before that rule: the owner rebuilds from the studies.
      this.needsRebuild = true;
      return;
    }
    const all = Array.isArray(held) ? [...held, study] : [held, study];
    this.#fill(cell, newest(all), all);
  }

  /**
   * Set when a change could not be applied exactly (see #place): the owner must rebuild the model from the
   * studies (fromStudies) before using it.
   */
  needsRebuild = false;

  /** Takes the study out of its characteristic's row; false when it is not there. */
  #takeFromRow(characteristicId: string, studyId: string): boolean {
    const row = this.#rowOf.get(characteristicId);
    if (row === undefined) return false;
    for (let cell = row * this.#span; cell < (row + 1) * this.#span; cell += 1)
      if (this.#holds(cell, studyId)) {
        this.#take(cell, studyId);
        return true;
      }
    return false;
  }

  #takeEverywhere(ids: Set<string>): void {
    for (let cell = 0; cell < this.#rowIds.length * this.#span; cell += 1) {
      const held = this.held[cell];
      if (Array.isArray(held)) {
        for (const s of held) if (ids.has(s.id)) this.#take(cell, s.id);
      } else if (this.ids[cell] !== undefined && ids.has(this.ids[cell]!)) this.#take(cell, this.ids[cell]!);
    }
  }

  #holds(cell: number, studyId: string): boolean {
    const held = this.held[cell];
    return Array.isArray(held) ? held.some((s) => s.id === studyId) : this.ids[cell] === studyId;
  }

  #take(cell: number, studyId: string): void {
    this.#live -= 1;
    const held = this.held[cell];
    if (!Array.isArray(held)) {
      this.#clear(cell);
      return;
    }
    const rest = held.filter((s) => s.id !== studyId);
    if (rest.length > 1) {
      this.held[cell] = rest;
      this.#fill(cell, newest(rest), rest);
    } else if (rest.length === 1) this.#fill(cell, rest[0]!);
    else this.#clear(cell);
  }

  /** Shows `study` in the cell; `all` is the month's every live study when it holds more than one. */
  #fill(cell: number, study: Study, all?: Study[]): void {
    const d = study.data;
    this.ids[cell] = study.id;
    this.tag[cell] = this.#tagOf?.(study) ?? 0;
    this.held[cell] = all ?? (d.kind === 'raw' ? study : undefined);
    this.rowStamp[Math.floor(cell / this.#span)] = nextStamp++;
    this.kind[cell] = KIND_CODE[d.kind];
    this.n[cell] = 0;
    this.mean[cell] = 0;
    this.sd[cell] = 0;
    this.units[cell] = 0;
    this.count[cell] = 0;
    this.opportunities[cell] = 0;
    switch (d.kind) {
      case 'summary':
        this.n[cell] = d.n;
        this.mean[cell] = d.mean;
        this.sd[cell] = d.sd;
        break;
      case 'raw': {
        const m = summariseMoments(d.values);
        this.n[cell] = m.n;
        this.mean[cell] = m.mean;
        this.sd[cell] = m.sd;
        break;
      }
      case 'defectives':
        this.units[cell] = d.units;
        this.count[cell] = d.defectives;
        break;
      case 'defects':
        this.units[cell] = d.units;
        this.count[cell] = d.defects;
        this.opportunities[cell] = d.opportunitiesPerUnit;
        break;
    }
  }

  #clear(cell: number): void {
    this.ids[cell] = undefined;
    this.held[cell] = undefined;
    this.kind[cell] = CELL.empty;
    this.rowStamp[Math.floor(cell / this.#span)] = nextStamp++;
  }

  /** The month columns needed to hold the present ones and `month`. */
  #monthsWith(month?: number): [number, number] {
    if (this.#span === 0) return month === undefined ? [0, 0] : [month, 1];
    if (month === undefined) return [this.#firstMonth, this.#span];
    const last = this.#firstMonth + this.#span - 1;
    // Grow by a year at a time on the side that needs it, so months logged one by one do not copy every time.
    const lo = month < this.#firstMonth ? month - 12 : this.#firstMonth;
    const hi = month > last ? month + 12 : last;
    return [lo, hi - lo + 1];
  }

  /** Moves every cell into arrays of `rows` × `span` months from `firstMonth`. */
  #reshape(rows: number, firstMonth: number, span: number): void {
    const size = rows * span;
    const old = {
      kind: this.kind,
      n: this.n,
      mean: this.mean,
      sd: this.sd,
      units: this.units,
      count: this.count,
      opportunities: this.opportunities,
      tag: this.tag,
      ids: this.ids,
      held: this.held
    };
    const oldSpan = this.#span;
    const shift = this.#firstMonth - firstMonth;
    this.kind = new Uint8Array(size);
    this.n = new Float64Array(size);
    this.mean = new Float64Array(size);
    this.sd = new Float64Array(size);
    this.units = new Float64Array(size);
    this.count = new Float64Array(size);
    this.opportunities = new Float64Array(size);
    this.tag = new Float64Array(size);
    this.ids = new Array<string | undefined>(size);
    this.held = new Array<Study | Study[] | undefined>(size);
    const rowsHeld = Math.min(this.#rowCapacity, rows);
    const oldRowStamp = this.rowStamp;
    this.rowStamp = new Float64Array(rows);
    this.rowStamp.set(oldRowStamp.subarray(0, rowsHeld));
    for (let r = 0; r < rowsHeld; r += 1)
      for (let c = 0; c < oldSpan; c += 1) {
        const from = r * oldSpan + c;
        if (old.ids[from] === undefined) continue;
        const to = r * span + c + shift;
        this.kind[to] = old.kind[from]!;
        this.n[to] = old.n[from]!;
        this.mean[to] = old.mean[from]!;
        this.sd[to] = old.sd[from]!;
        this.units[to] = old.units[from]!;
        this.count[to] = old.count[from]!;
        this.opportunities[to] = old.opportunities[from]!;
        this.tag[to] = old.tag[from]!;
        this.ids[to] = old.ids[from];
        this.held[to] = old.held[from];
      }
    this.#rowCapacity = rows;
    this.#firstMonth = firstMonth;
    this.#span = span;
  }
}

/** The study a month shows among several: the newer edit, then the lower id (onePerMonth's rule). */
function newest(studies: readonly Study[]): Study {
  return studies.reduce((a, b) => {
    const order = compareEdits(b, a);
    return order > 0 || (order === 0 && b.id < a.id) ? b : a;
  });
}

/** A month ordinal (monthOrdinal) back as `YYYY-MM`. */
export function periodOfOrdinal(month: number): string {
  const year = Math.floor(month / 12);
  const m = month - year * 12 + 1;
  return `${String(year).padStart(4, '0')}-${m < 10 ? '0' : ''}${m}`;
}

const built = new WeakMap<readonly Study[], MonthlyStatistics>();

/**
 * The read model of a record set: the one it carries (kept up to date by its owner), else one built from its
 * studies on first use and remembered while the same array is passed.
 */
export function statisticsOf(records: PortfolioRecords): MonthlyStatistics {
  if (records.statistics) return records.statistics;
  let model = built.get(records.studies);
  if (!model) built.set(records.studies, (model = MonthlyStatistics.fromStudies(records.studies)));
  return model;
}
