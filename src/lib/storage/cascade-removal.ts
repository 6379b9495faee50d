import type { Table } from 'dexie';
import { CHILD_KINDS, type RecordKind } from '../domain/record-kinds';
import {
  isLive,
  stampDeleted,
  stampRestored,
  type RecordMeta,
  type WriteContext
} from '../domain/record-meta';
import type { CapstanDatabase } from './database';
import { RecordNotFoundError } from './record-repository';
import { putOfKind, plainTableOf, tablesOfKinds } from './records-of-kind';
import { recordsUnder } from './records-under';

/**
 * Deleting a record with everything under it (a site, a process or a characteristic), and undoing that. The
 * deletion time marks what one deletion took along: every record it deletes gets the parent's deletion time, and
 * undo (or a merge that keeps the parent, domain/change-set-merge.ts) brings back exactly those. A record under
 * it already deleted on its own keeps its own time: the deletion moves on by a millisecond rather than share it.
 */
export type ParentKind = 'sites' | 'processes' | 'characteristics';

export interface Removal {
  kind: ParentKind;
  record: RecordMeta;
  deletedAt: string;
  /** Live records under it that the deletion took along, by kind. */
  counts: Partial<Record<RecordKind, number>>;
}

const LABEL: Record<ParentKind, string> = {
  sites: 'Site',
  processes: 'Process',
  characteristics: 'Characteristic'
};

const table = (db: CapstanDatabase, kind: ParentKind) => plainTableOf(db, kind);

export function cascadeTables(db: CapstanDatabase): Table[] {
  return tablesOfKinds(db, ['sites', 'processes', 'characteristics', 'studies', 'projects']);
}

/** Every record under a parent (live or not), parents before children. Runs inside the caller's transaction. */
async function descendants(
  db: CapstanDatabase,
  kind: RecordKind,
  id: string
): Promise<{ kind: RecordKind; record: RecordMeta }[]> {
  const out: { kind: RecordKind; record: RecordMeta }[] = [];
  let frontier: { kind: RecordKind; ids: string[] }[] = [{ kind, ids: [id] }];
  while (frontier.length > 0) {
    const next: { kind: RecordKind; ids: string[] }[] = [];
    for (const { kind: parentKind, ids } of frontier) {
      for (const childKind of CHILD_KINDS[parentKind] ?? []) {
        const rows = await recordsUnder(db, childKind, ids);
        for (const r of rows) out.push({ kind: childKind, record: r });
        if (rows.length > 0) next.push({ kind: childKind, ids: rows.map((r) => r.id) });
      }
    }
    frontier = next;
  }
  return out;
}

/** Live records under a parent, by kind: what deleting it would take along (for the question before). */
export async function liveCountsUnder(
  db: CapstanDatabase,
  kind: ParentKind,
  id: string
): Promise<Partial<Record<RecordKind, number>>> {
  return db.transaction('r', cascadeTables(db), async () => {
    const counts: Partial<Record<RecordKind, number>> = {};
    for (const d of await descendants(db, kind, id))
      if (isLive(d.record)) counts[d.kind] = (counts[d.kind] ?? 0) + 1;
    return counts;
  });
}

export async function removeWithContents(
  db: CapstanDatabase,
  ctx: WriteContext,
  kind: ParentKind,
  id: string
): Promise<Removal> {
  return db.transaction('rw', cascadeTables(db), async () => {
    const parent = await table(db, kind).get(id);
    if (!parent || !isLive(parent)) throw new RecordNotFoundError(LABEL[kind], id);
    const under = await descendants(db, kind, id);
    const taken = new Set(under.flatMap((d) => (d.record.deletedAt ? [d.record.deletedAt] : [])));
    let ms = ctx.now().getTime();
    while (taken.has(new Date(ms).toISOString())) ms += 1;
    const at = new Date(ms);
    const fixed = { ...ctx, now: () => at };
    const tombstone = stampDeleted(parent, fixed);
    const counts: Partial<Record<RecordKind, number>> = {};
    const writes = new Map<RecordKind, RecordMeta[]>();
    for (const d of under) {
      if (!isLive(d.record)) continue;
      counts[d.kind] = (counts[d.kind] ?? 0) + 1;
      const list = writes.get(d.kind) ?? [];
      list.push(stampDeleted(d.record, fixed));
      writes.set(d.kind, list);
    }
    for (const [k, rows] of writes) await putOfKind(db, k, rows);
    await table(db, kind).put(tombstone);
    return { kind, record: tombstone, deletedAt: tombstone.deletedAt!, counts };
  });
}

export async function undoRemoval(db: CapstanDatabase, ctx: WriteContext, removal: Removal): Promise<void> {
  await db.transaction('rw', cascadeTables(db), async () => {
    const parent = await table(db, removal.kind).get(removal.record.id);
    if (!parent || parent.deletedAt !== removal.deletedAt)
      throw new RecordNotFoundError(`Deleted ${LABEL[removal.kind].toLowerCase()}`, removal.record.id);
    await table(db, removal.kind).put(stampRestored(parent, ctx));
    const writes = new Map<RecordKind, RecordMeta[]>();
    for (const d of await descendants(db, removal.kind, removal.record.id)) {
      if (d.record.deletedAt !== removal.deletedAt) continue;
      const list = writes.get(d.kind) ?? [];
      list.push(stampRestored(d.record, ctx));
      writes.set(d.kind, list);
    }
    for (const [k, rows] of writes) await putOfKind(db, k, rows);
  });
}
