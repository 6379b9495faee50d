import { CHILD_KINDS, parentIdOf, RECORD_KINDS, type RecordKind, type RecordsByKind } from './record-kinds';
import type { RecordMeta } from './record-meta';
import type { Study } from './study';

export interface IndexedRecord {
  kind: RecordKind;
  record: RecordMeta;
}

/**
 * Records of every kind by id, with the two look-ups a merge needs: a parent's children, and the studies of one
 * characteristic and month. Built from a whole record set (the command line's files) or from the part of a
 * database a merge touches (change-set-store.ts prefetches exactly that). Mutable: a merge works on a copy.
 */
export class RecordIndex {
  protected byId = new Map<string, IndexedRecord>();
  protected children = new Map<string, Set<string>>();
  /**
   * Ids of each month's studies, by characteristic then period: two look-ups of strings as they were read
   * (their hashes known) rather than a joined key built and hashed for every study. A list, not a set: a month
   * holds one study, rarely two, and a set per month (72 000 for a company's file) cost a merge plan a third
   * of its time in collecting garbage.
   */
  protected months = new Map<string, Map<string, string[]>>();
  #writes = 0;

  /** Writes so far: a copy of this index checks that none came after it was made (IndexCopy). */
  get writeCount(): number {
    return this.#writes;
  }

  protected countWrite(): void {
    this.#writes += 1;
  }

  protected monthIds(
    study: Pick<Study, 'characteristicId' | 'period'>,
    create: boolean
  ): string[] | undefined {
    let periods = this.months.get(study.characteristicId);
    if (!periods) {
      if (!create) return undefined;
      this.months.set(study.characteristicId, (periods = new Map()));
    }
    let ids = periods.get(study.period);
    if (!ids && create) periods.set(study.period, (ids = []));
    return ids;
  }

  constructor(records?: Partial<RecordsByKind>) {
    if (!records) return;
    for (const kind of RECORD_KINDS) {
      for (const r of (records[kind] ?? []) as RecordMeta[]) this.set(kind, r);
    }
  }

  /**
   * An index of the same records that changes without changing this one (IndexCopy): it holds what is written to
   * it and reads the rest here, so this index must not change while the copy is in use.
   */
  copy(): RecordIndex {
    // A copy of an empty index (a file received into an empty database) has nothing to read through.
    return this.byId.size === 0 ? new RecordIndex() : new IndexCopy(this);
  }

  /** Whether a record is among a parent's children. */
  hasChild(parentId: string, id: string): boolean {
    return this.children.get(parentId)?.has(id) === true;
  }

  /** Ids of one characteristic and month's studies as held, not to be changed by the caller; undefined for none. */
  monthIdsHeld(characteristicId: string, period: string): readonly string[] | undefined {
    return this.monthIds({ characteristicId, period }, false);
  }

  /** Ids of a record's direct children, added to `out`. */
  childIdsInto(id: string, out: string[]): string[] {
    for (const childId of this.children.get(id) ?? []) out.push(childId);
    return out;
  }

  get(id: string): IndexedRecord | undefined {
    return this.byId.get(id);
  }

  record(id: string): RecordMeta | undefined {
    return this.byId.get(id)?.record;
  }

  /** Stores (or replaces) a record and keeps the look-ups current. */
  set(kind: RecordKind, record: RecordMeta): void {
    const before = this.byId.get(record.id)?.record;
    this.countWrite();
    if (before && kind === 'studies') {
      const ids = this.monthIds(before as Study, false);
      const at = ids ? ids.indexOf(before.id) : -1;
      if (at >= 0) ids!.splice(at, 1);
    }
    this.byId.set(record.id, { kind, record });
    const parent = parentIdOf(kind, record);
    if (parent !== undefined) {
      let set = this.children.get(parent);
      if (!set) this.children.set(parent, (set = new Set()));
      set.add(record.id);
    }
    if (kind === 'studies') {
      this.monthIds(record as Study, true)!.push(record.id);
    }
  }

  /** Direct children of a record (live or not), of the child kinds its own kind has. */
  childrenOf(kind: RecordKind, id: string): IndexedRecord[] {
    if (!CHILD_KINDS[kind]) return [];
    const out: IndexedRecord[] = [];
    for (const childId of this.children.get(id) ?? []) {
      const c = this.byId.get(childId);
      if (c) out.push(c);
    }
    return out;
  }

  /** Every descendant of a record, parents before their children. */
  descendantsOf(kind: RecordKind, id: string): IndexedRecord[] {
    // Breadth first, the list itself as the queue (read by position): shifting a queue moved every record left
    // behind it, and a site of a company's portfolio has tens of thousands of descendants.
    const out: IndexedRecord[] = this.childrenOf(kind, id);
    for (let i = 0; i < out.length; i += 1) {
      const next = out[i]!;
      for (const child of this.childrenOf(next.kind, next.record.id)) out.push(child);
    }
    return out;
  }

  /** How many studies (live or not) one characteristic and month holds, without looking them up. */
  studyCountOfMonth(characteristicId: string, period: string): number {
    return this.monthIds({ characteristicId, period }, false)?.length ?? 0;
  }

  /** Studies (live or not) of one characteristic and month. */
  studiesOfMonth(characteristicId: string, period: string): Study[] {
    const ids = this.monthIds({ characteristicId, period }, false);
    return ids ? ids.map((id) => this.byId.get(id)!.record as Study) : [];
  }

  values(): IterableIterator<IndexedRecord> {
    return this.byId.values();
  }
}

/**
 * A copy of a record index made by `copy`: what is written to it is held here, the rest is read from the index it
 * was copied from (`under`). A merge plans and settles on a copy of the records it read, and writes little to it
 * when a file brings little new: copying a company's 800 000 records key by key took 0.55–0.95 s in Node for
 * every file received, twice for one merged (a 20 000-process file received again reached its preview in Chromium
 * 0.9 s sooner without). A write to `under` while the copy is in use makes every later use of the copy throw, rather
 * than read a mixture of the two.
 *
 * A class of its own, so that RecordIndex's look-ups stay as they were for the index itself.
 */
class IndexCopy extends RecordIndex {
  readonly #under: RecordIndex;
  readonly #underWrites: number;

  constructor(under: RecordIndex) {
    super();
    this.#under = under;
    this.#underWrites = under.writeCount;
  }

  /** The index under this copy, after checking that it has not changed since the copy was made. */
  #base(): RecordIndex {
    if (this.#under.writeCount !== this.#underWrites)
      throw new Error(
        'A record index changed while a copy of it was in use: the copy no longer stands for it'
      );
    return this.#under;
  }

  override copy(): RecordIndex {
    return new IndexCopy(this);
  }

  override get(id: string): IndexedRecord | undefined {
    return this.byId.get(id) ?? this.#base().get(id);
  }

  override record(id: string): RecordMeta | undefined {
    return this.get(id)?.record;
  }

  override hasChild(parentId: string, id: string): boolean {
    return this.children.get(parentId)?.has(id) === true || this.#base().hasChild(parentId, id);
  }

  override monthIdsHeld(characteristicId: string, period: string): readonly string[] | undefined {
    return (
      this.monthIds({ characteristicId, period }, false) ??
      this.#base().monthIdsHeld(characteristicId, period)
    );
  }

  /** A month's ids to change here: this copy's own list, made from the one under it when it has none yet. */
  #monthIdsToChange(characteristicId: string, period: string): string[] {
    let periods = this.months.get(characteristicId);
    if (!periods) this.months.set(characteristicId, (periods = new Map()));
    let ids = periods.get(period);
    if (!ids) periods.set(period, (ids = this.#base().monthIdsHeld(characteristicId, period)?.slice() ?? []));
    return ids;
  }

  override set(kind: RecordKind, record: RecordMeta): void {
    const base = this.#base();
    const before = this.get(record.id)?.record;
    this.countWrite();
    if (before && kind === 'studies') {
      const was = before as Study;
      if (this.monthIdsHeld(was.characteristicId, was.period)?.includes(before.id)) {
        const ids = this.#monthIdsToChange(was.characteristicId, was.period);
        ids.splice(ids.indexOf(before.id), 1);
      }
    }
    this.byId.set(record.id, { kind, record });
    const parent = parentIdOf(kind, record);
    if (parent !== undefined && !base.hasChild(parent, record.id)) {
      let set = this.children.get(parent);
      if (!set) this.children.set(parent, (set = new Set()));
      set.add(record.id);
    }
    if (kind === 'studies') {
      const study = record as Study;
      this.#monthIdsToChange(study.characteristicId, study.period).push(record.id);
    }
  }

  override childIdsInto(id: string, out: string[]): string[] {
    this.#base().childIdsInto(id, out);
    return super.childIdsInto(id, out);
  }

  override childrenOf(kind: RecordKind, id: string): IndexedRecord[] {
    if (!CHILD_KINDS[kind]) return [];
    const out: IndexedRecord[] = [];
    for (const childId of this.childIdsInto(id, [])) {
      const c = this.get(childId);
      if (c) out.push(c);
    }
    return out;
  }

  override studyCountOfMonth(characteristicId: string, period: string): number {
    return this.monthIdsHeld(characteristicId, period)?.length ?? 0;
  }

  override studiesOfMonth(characteristicId: string, period: string): Study[] {
    const ids = this.monthIdsHeld(characteristicId, period);
    return ids ? ids.map((id) => this.get(id)!.record as Study) : [];
  }

  override *values(): IterableIterator<IndexedRecord> {
    yield* this.byId.values();
    for (const entry of this.#base().values()) if (!this.byId.has(entry.record.id)) yield entry;
  }
}
