import { CHILD_KINDS, parentIdOf, RECORD_KINDS, type RecordKind, type RecordsByKind } from './record-kinds';
import type { RecordMeta } from './record-meta';
import type { Study } from './study';
import { studyMonthKey } from './study-month';

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
  private readonly byId = new Map<string, IndexedRecord>();
  private readonly children = new Map<string, Set<string>>();
  private readonly months = new Map<string, Set<string>>();

  constructor(records?: Partial<RecordsByKind>) {
    if (!records) return;
    for (const kind of RECORD_KINDS) {
      for (const r of (records[kind] ?? []) as RecordMeta[]) this.set(kind, r);
    }
  }

  copy(): RecordIndex {
    const out = new RecordIndex();
    for (const { kind, record } of this.byId.values()) out.set(kind, record);
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
    if (before && kind === 'studies') this.months.get(studyMonthKey(before as Study))?.delete(before.id);
    this.byId.set(record.id, { kind, record });
    const parent = parentIdOf(kind, record);
    if (parent !== undefined) {
      let set = this.children.get(parent);
      if (!set) this.children.set(parent, (set = new Set()));
      set.add(record.id);
    }
    if (kind === 'studies') {
      const key = studyMonthKey(record as Study);
      let set = this.months.get(key);
      if (!set) this.months.set(key, (set = new Set()));
      set.add(record.id);
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
    const out: IndexedRecord[] = [];
    const queue: IndexedRecord[] = this.childrenOf(kind, id);
    while (queue.length > 0) {
      const next = queue.shift()!;
      out.push(next);
      queue.push(...this.childrenOf(next.kind, next.record.id));
    }
    return out;
  }

  /** Studies (live or not) of one characteristic and month. */
  studiesOfMonth(characteristicId: string, period: string): Study[] {
    const ids = this.months.get(studyMonthKey({ characteristicId, period })) ?? new Set<string>();
    return [...ids].map((id) => this.byId.get(id)!.record as Study);
  }

  values(): IterableIterator<IndexedRecord> {
    return this.byId.values();
  }
}
