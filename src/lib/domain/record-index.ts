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
  private byId = new Map<string, IndexedRecord>();
  private children = new Map<string, Set<string>>();
  /**
   * Ids of each month's studies, by characteristic then period: two look-ups of strings as they were read
   * (their hashes known) rather than a joined key built and hashed for every study. A list, not a set: a month
   * holds one study, rarely two, and a set per month (72 000 for a company's file) cost a merge plan a third
   * of its time in collecting garbage.
   */
  private months = new Map<string, Map<string, string[]>>();

  private monthIds(study: Pick<Study, 'characteristicId' | 'period'>, create: boolean): string[] | undefined {
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

  /** An independent index of the same records: the maps cloned, not rebuilt record by record. */
  copy(): RecordIndex {
    const out = new RecordIndex();
    out.byId = new Map(this.byId);
    out.children = new Map();
    for (const [id, set] of this.children) out.children.set(id, new Set(set));
    out.months = new Map();
    for (const [characteristicId, periods] of this.months) {
      const copied = new Map<string, string[]>();
      for (const [period, ids] of periods) copied.set(period, ids.slice());
      out.months.set(characteristicId, copied);
    }
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
