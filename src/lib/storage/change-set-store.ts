import type { Table } from 'dexie';
import { canonicalJson } from '../domain/canonical-json';
import {
  MergeRefused,
  planMergeSteps,
  settleMergeSteps,
  type MergeChoices,
  type MergePlan
} from '../domain/change-set-merge';
import type { HybridClock } from '../domain/hybrid-clock';
import { sortById } from '../domain/id-order';
import { RecordIndex, type IndexedRecord } from '../domain/record-index';
import {
  CHILD_KINDS,
  emptyRecords,
  KIND_LABEL,
  PARENT_OF,
  parentIdOf,
  RECORD_KINDS,
  type RecordKind,
  type RecordsByKind
} from '../domain/record-kinds';
import type { MergeKind } from '../domain/record-merge';
import {
  boundedToClock,
  isLive,
  travelling,
  versionOf,
  type RecordMeta,
  type WriteContext
} from '../domain/record-meta';
import type { Study } from '../domain/study';
import { StudyMonthSet } from '../domain/study-month';
import type { CapstanDatabase, StudyRevision } from './database';
import { LAST_EXPORT_KEY } from './backup-status';
import { saveClock } from './device-identity';
import { allOfKind, changedSince, plainTableOf, putOfKind, tablesOfKinds } from './records-of-kind';
import { recordsUnder } from './records-under';
import { studiesAmong, studiesUnder } from './study-shelves';
import { runInSlices } from './sliced-run';
import { pauseEvery, type Steps } from '../domain/work-steps';

/**
 * Change sets: what this device sends to a peer, and how one received from a peer is merged in. Nothing here
 * knows about files — a change set is records by kind, whatever carries it (see exchange/change-set-transport.ts).
 */

/** What an export covers. `changes` is everything written on this device since the last export to that peer. */
export type ExportScope =
  { kind: 'everything' } | { kind: 'site'; siteId: string } | { kind: 'changes'; peerId: string };

/** Another device this one has exchanged files with, as remembered here (device-local). */
export interface PeerRecord {
  deviceId: string;
  name: string;
  /** Last time a change set was prepared for this peer, and the write sequence it covered. */
  lastSentAt?: string;
  sentThrough?: number;
  /** Last time a change set from this peer was merged here. */
  lastReceivedAt?: string;
}

/**
 * A file sent while a write was still committing in another tab could miss that write if the checkpoint were
 * the exact sequence sent. Importing a record twice changes nothing, so the checkpoint stays a minute behind
 * the export time: the next export to the same peer re-sends whatever was written in that last minute.
 */
const CHECKPOINT_MARGIN_MS = 60_000;

const PEER_PREFIX = 'peer:';

type AnyTable = Table<RecordMeta, string>;

export interface CollectedChanges {
  records: RecordsByKind;
  /** Highest write sequence included, for the peer's checkpoint. */
  highWater: number;
  /** The `changes` scope: the sequence the change set starts after (undefined = from the beginning). */
  since?: number;
}

/** Reads what a scope covers, tombstones included, each kind in id order (canonical: same data, same bytes). */
export async function collectChanges(db: CapstanDatabase, scope: ExportScope): Promise<CollectedChanges> {
  const tables = tablesOfKinds(db, RECORD_KINDS);
  return db.transaction('r', [...tables, db.deviceSettings], async () => {
    const records = emptyRecords() as unknown as Record<RecordKind, RecordMeta[]>;
    let since: number | undefined;
    if (scope.kind === 'everything' || scope.kind === 'changes') {
      if (scope.kind === 'changes') since = (await loadPeer(db, scope.peerId))?.sentThrough;
      for (const kind of RECORD_KINDS)
        records[kind] = since === undefined ? await allOfKind(db, kind) : await changedSince(db, kind, since);
    } else {
      const site = await db.sites.get(scope.siteId);
      if (!site) throw new Error(`Site ${scope.siteId} does not exist on this device`);
      const processes = await recordsUnder(db, 'processes', [site.id]);
      const processIds = processes.map((p) => p.id);
      const characteristics = await recordsUnder(db, 'characteristics', processIds);
      records.sites = [site];
      records.processes = processes;
      records.characteristics = characteristics;
      records.studies = (await recordsUnder(
        db,
        'studies',
        characteristics.map((c) => c.id)
      )) as Study[];
      records.projects = (await recordsUnder(db, 'projects', processIds)) as RecordsByKind['projects'];
      // Targets travel with every site file: the site judges its processes against the same profiles.
      records.contextProfiles = await db.contextProfiles.toArray();
    }
    let highWater = 0;
    const nowMs = Date.now();
    for (const kind of RECORD_KINDS) {
      for (const r of records[kind]) if ((r.localSeq ?? 0) > highWater) highWater = r.localSeq ?? 0;
      records[kind] = sortById(records[kind].map((r) => boundedToClock(travelling(r), nowMs)));
    }
    return { records: records as unknown as RecordsByKind, highWater, since };
  });
}

/** Remembers that a change set was prepared: the peer's checkpoint, and this device's last export time. */
export async function recordExport(
  db: CapstanDatabase,
  clock: HybridClock,
  at: string,
  collected: Pick<CollectedChanges, 'highWater'>,
  peer?: { deviceId: string; name: string }
): Promise<void> {
  await db.transaction('rw', db.deviceSettings, async () => {
    if (peer) {
      const known = (await loadPeer(db, peer.deviceId)) ?? { deviceId: peer.deviceId, name: peer.name };
      const settled = Math.min(collected.highWater, Date.now() - CHECKPOINT_MARGIN_MS);
      const sentThrough = Math.max(known.sentThrough ?? 0, settled);
      await savePeer(db, { ...known, name: peer.name || known.name, lastSentAt: at, sentThrough });
    }
    const highWater = Math.max(collected.highWater, db.sequence.latest);
    await db.deviceSettings.put({ key: LAST_EXPORT_KEY, value: { at, highWater } });
    await saveClock(db, clock);
  });
}

export async function loadPeer(db: CapstanDatabase, deviceId: string): Promise<PeerRecord | undefined> {
  const row = await db.deviceSettings.get(PEER_PREFIX + deviceId);
  return row?.value as PeerRecord | undefined;
}

async function savePeer(db: CapstanDatabase, peer: PeerRecord): Promise<void> {
  await db.deviceSettings.put({ key: PEER_PREFIX + peer.deviceId, value: peer });
}

export async function listPeers(db: CapstanDatabase): Promise<PeerRecord[]> {
  const rows = await db.deviceSettings.where('key').startsWith(PEER_PREFIX).toArray();
  return rows.map((r) => r.value as PeerRecord).sort((a, b) => a.name.localeCompare(b.name));
}

/**
 * What a preview found: the merge plan (domain/change-set-merge.ts) and the part of this device's records it was
 * made from, so that applying it settles against exactly what was shown.
 */
export interface ReceivePlan extends MergePlan {
  snapshot: RecordIndex;
}

/** Thrown when a change set cannot be merged at all (nothing has been written). */
export class ChangeSetRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ChangeSetRefused';
  }
}

const PARENT_KINDS: RecordKind[] = ['sites', 'processes', 'characteristics'];

/**
 * The records of one table whose ids are among `ids` (studies: studiesAmong, study-shelves.ts). A whole file's ids looked up one by one in every table
 * cost half a million reads for a company's portfolio (tens of seconds); instead the table's keys are read in
 * one request and only those among `ids` fetched. Given a set (the preview: every id of the file, tested in each
 * of seven tables), the table's keys are tested against it — the file's 760 000 ids tested against each table held
 * the page for 0.27 s. Given a list (the merge: one kind's writes), the smaller of the two becomes the set, so that
 * a first merge into an empty table builds none of hundreds of thousands.
 */
async function storedAmong(
  db: CapstanDatabase,
  kind: Exclude<RecordKind, 'studies'>,
  ids: ReadonlySet<string> | readonly string[]
): Promise<RecordMeta[]> {
  const count = 'size' in ids ? ids.size : ids.length;
  if (count === 0) return [];
  const table = plainTableOf(db, kind);
  let present: string[];
  if (count < 64) present = [...ids];
  else {
    const keys = (await table.toCollection().primaryKeys()) as string[];
    if ('has' in ids) present = keys.filter((id) => ids.has(id));
    else if (keys.length <= ids.length) {
      const held = new Set(keys);
      present = ids.filter((id) => held.has(id));
    } else {
      const wanted = new Set(ids);
      present = keys.filter((id) => wanted.has(id));
    }
    // Most of the table wanted (a device's whole file received again, as folder sync does): the table read in
    // one request and filtered, not asked for key by key — 72 000 studies took 4.8–6.7 s by key in the worker.
    if (present.length > keys.length / 2) {
      const take = new Set(present);
      return (await table.toArray()).filter((r) => take.has(r.id));
    }
  }
  return (await getInParts(table, present)).filter((r): r is RecordMeta => r !== undefined);
}

/** Every id a change set names, gathered in steps (a company's file names some 760 000). */
function* idsOfSteps(records: RecordsByKind): Steps<Set<string>> {
  const pause = pauseEvery(4096);
  const ids = new Set<string>();
  for (const kind of RECORD_KINDS)
    for (const r of records[kind] as RecordMeta[]) {
      if (pause()) yield;
      ids.add(r.id);
    }
  return ids;
}

/**
 * Keys per bulkGet of getInParts: Dexie asks IndexedDB for each key of a bulkGet in the same task, some 35 µs a
 * key here, and the 20 000 characteristics a company's file names held the page for 0.7 s in one call.
 */
const KEYS_PER_GET = 1000;

/** `table.bulkGet(keys)`, a part at a time (KEYS_PER_GET), so that the page's thread is free between them. */
async function getInParts(table: AnyTable, keys: readonly string[]): Promise<(RecordMeta | undefined)[]> {
  // One bulkGet even for no key, as before: returning without one made the snapshot's next read fail with
  // "Transaction committed too early" (seen with fake-indexeddb in the unit tests).
  if (keys.length <= KEYS_PER_GET) return table.bulkGet([...keys]);
  const out: (RecordMeta | undefined)[] = [];
  for (let i = 0; i < keys.length; i += KEYS_PER_GET)
    for (const r of await table.bulkGet(keys.slice(i, i + KEYS_PER_GET))) out.push(r);
  return out;
}

/**
 * Reads the part of this device's records a merge of `records` touches: the local version of every record in
 * the change set, the ancestors of each, the studies of every month the change set logs, and every descendant
 * of a parent that is deleted on either side (a family the merge may have to bring back or delete whole).
 * Runs inside the caller's read transaction.
 */
async function snapshotFor(
  db: CapstanDatabase,
  records: RecordsByKind,
  fileIds: ReadonlySet<string>
): Promise<RecordIndex> {
  const index = new RecordIndex();
  const have = (id: string) => index.get(id) !== undefined;
  const add = (kind: RecordKind, rows: (RecordMeta | undefined)[]) => {
    for (const r of rows) if (r) index.set(kind, r);
  };
  // The studies of every characteristic the file logs, read once for both of the lookups below: the local
  // version of each of the file's studies, and the studies of each month it logs. A study is found by its
  // characteristic (study-shelves.ts): an id the file names as a study on another characteristic than here is
  // not found (a study never moves; the app cannot write one that does).
  const shelved = await studiesUnder(db, [...new Set(records.studies.map((s) => s.characteristicId))]);
  // Ids the file names, and ids used as another kind here (refused by the plan).
  for (const kind of RECORD_KINDS)
    add(
      kind,
      kind === 'studies' ? shelved.filter((r) => fileIds.has(r.id)) : await storedAmong(db, kind, fileIds)
    );
  // Ancestors of everything in the file, up to the site.
  for (const kind of ['studies', 'projects', 'characteristics', 'processes'] as RecordKind[]) {
    const parent = PARENT_OF[kind]!;
    const wanted = new Set<string>();
    for (const r of records[kind] as RecordMeta[]) wanted.add(parentIdOf(kind, r)!);
    for (const { kind: k, record } of [...index.values()])
      if (k === kind) wanted.add(parentIdOf(kind, record)!);
    // An id the file names and no table here holds (storedAmong asked every table) is not asked for again.
    const missing = [...wanted].filter((id) => !have(id) && !fileIds.has(id));
    add(
      parent.kind,
      await getInParts(plainTableOf(db, parent.kind as Exclude<RecordKind, 'studies'>), missing)
    );
  }
  // Studies of every month the file logs.
  const months = new StudyMonthSet();
  for (const study of records.studies) months.add(study);
  add(
    'studies',
    shelved.filter((r) => !have(r.id) && months.has(r))
  );
  // Families: descendants of every parent deleted on either side.
  const incomingById = new Map<string, RecordMeta>();
  for (const kind of PARENT_KINDS) for (const r of records[kind] as RecordMeta[]) incomingById.set(r.id, r);
  let frontier: { kind: RecordKind; id: string }[] = [];
  for (const { kind, record } of [...index.values()]) {
    if (!PARENT_KINDS.includes(kind)) continue;
    const there = incomingById.get(record.id);
    if (!isLive(record) || (there && !isLive(there))) frontier.push({ kind, id: record.id });
  }
  const expanded = new Set<string>();
  while (frontier.length > 0) {
    const next: { kind: RecordKind; id: string }[] = [];
    for (const childKind of RECORD_KINDS) {
      const parentKind = PARENT_OF[childKind]?.kind;
      if (!parentKind) continue;
      const ids = frontier.filter((f) => f.kind === parentKind && !expanded.has(`${childKind}:${f.id}`));
      if (ids.length === 0) continue;
      for (const f of ids) expanded.add(`${childKind}:${f.id}`);
      const rows = await recordsUnder(
        db,
        childKind,
        ids.map((f) => f.id)
      );
      add(childKind, rows);
      if (CHILD_KINDS[childKind]) for (const r of rows) next.push({ kind: childKind, id: r.id });
    }
    frontier = next;
  }
  return index;
}

/**
 * Works out, without writing, what merging a change set would do to every record. Refuses (ChangeSetRefused)
 * an id that this device holds as a different kind of record.
 */
export async function previewChangeSet(db: CapstanDatabase, records: RecordsByKind): Promise<ReceivePlan> {
  const tables = tablesOfKinds(db, RECORD_KINDS);
  // Gathered before the read transaction: it may pause only while a request of its own is pending.
  const fileIds = await runInSlices(idsOfSteps(records));
  // An async scope, as every transaction's: Dexie keeps a transaction's zone across native awaits only from an
  // async scope function; this one, a plain arrow returning snapshotFor's promise, lost it after the first reads
  // of a file already held here, which then ran outside the transaction and refused the import in Chromium.
  const snapshot = await db.transaction('r', tables, async () => snapshotFor(db, records, fileIds));
  // Planned after the read, in slices, so that a company's file never holds the page for long. A record that
  // changes here meanwhile is caught when the merge is written (applyChangeSet compares it with the snapshot).
  try {
    return { ...(await runInSlices(planMergeSteps(snapshot, records))), snapshot };
  } catch (error) {
    if (error instanceof MergeRefused) throw new ChangeSetRefused(error.message);
    throw error;
  }
}

export interface ReceiveResult {
  counts: Record<MergeKind, number>;
  written: number;
}

/**
 * Writes a previewed merge in one transaction: all of it or nothing. Refuses when a conflict is left unsettled
 * or when a record it would write changed on this device after the preview (preview again). Studies replaced
 * by the merge are kept as revisions, so an import can be looked back on.
 */
export async function applyChangeSet(
  db: CapstanDatabase,
  plan: ReceivePlan,
  choices: MergeChoices,
  ctx: WriteContext,
  clock: HybridClock,
  source: { deviceId: string; name: string; at: string },
  onWritten?: (written: number, total: number) => void
): Promise<ReceiveResult> {
  let writes: IndexedRecord[];
  try {
    writes = await runInSlices(settleMergeSteps(plan.snapshot, plan, choices, ctx));
  } catch (error) {
    if (error instanceof MergeRefused) throw new ChangeSetRefused(error.message);
    throw error;
  }
  const tables = tablesOfKinds(db, RECORD_KINDS);
  return db.transaction('rw', [...tables, db.deviceSettings, db.studyRevisions], async () => {
    let written = 0;
    const progress = (count: number) => {
      written += count;
      onWritten?.(written, writes.length);
    };
    for (const kind of RECORD_KINDS) {
      const mine = writes.filter((w) => w.kind === kind);
      if (mine.length === 0) continue;
      const ids = mine.map((w) => w.record.id);
      const held =
        kind === 'studies'
          ? await studiesAmong(
              db,
              [...new Set(mine.map((w) => (w.record as Study).characteristicId))],
              new Set(ids)
            )
          : await storedAmong(db, kind, ids);
      const stored = new Map(held.map((r) => [r.id, r]));
      const revisions: StudyRevision[] = [];
      for (const w of mine) {
        const current = stored.get(w.record.id);
        const expected = plan.snapshot.record(w.record.id);
        const same =
          current === undefined
            ? expected === undefined
            : expected !== undefined &&
              canonicalJson(versionOf(current)) === canonicalJson(versionOf(expected));
        if (!same) {
          throw new ChangeSetRefused(
            `${KIND_LABEL[kind]} ${w.record.id} changed on this device after the preview; nothing was imported — preview the file again`
          );
        }
        if (kind === 'studies' && current && isLive(current)) {
          revisions.push({
            id: ctx.newId(),
            studyId: current.id,
            savedAt: source.at,
            reason: 'imported',
            study: current as Study
          });
        }
      }
      await putOfKind(
        db,
        kind,
        mine.map((w) => w.record),
        progress
      );
      if (revisions.length > 0) await db.studyRevisions.bulkAdd(revisions);
    }
    clock.observe(plan.latestStamp);
    await saveClock(db, clock);
    const known = (await loadPeer(db, source.deviceId)) ?? { deviceId: source.deviceId, name: source.name };
    await savePeer(db, { ...known, name: source.name || known.name, lastReceivedAt: source.at });
    return { counts: { ...plan.counts }, written: writes.length };
  });
}
