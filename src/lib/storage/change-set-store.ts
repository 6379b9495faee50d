import type { Table } from 'dexie';
import { canonicalJson } from '../domain/canonical-json';
import { laterStamp, type HybridClock } from '../domain/hybrid-clock';
import {
  emptyRecords,
  KIND_LABEL,
  RECORD_KINDS,
  type RecordKind,
  type RecordsByKind
} from '../domain/record-kinds';
import {
  mergeRecord,
  settleConflict,
  type ConflictRule,
  type MergeDecision,
  type MergeKind
} from '../domain/record-merge';
import { clockOf, compareById, travelling, versionOf, type RecordMeta } from '../domain/record-meta';
import type { Study } from '../domain/study';
import type { CapstanDatabase } from './database';
import { LAST_EXPORT_KEY } from './backup-status';
import { saveClock } from './device-identity';

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
const tableOf = (db: CapstanDatabase, kind: RecordKind) => db.table(kind) as unknown as AnyTable;

export interface CollectedChanges {
  records: RecordsByKind;
  /** Highest write sequence included, for the peer's checkpoint. */
  highWater: number;
  /** The `changes` scope: the sequence the change set starts after (undefined = from the beginning). */
  since?: number;
}

/** Reads what a scope covers, tombstones included, each kind in id order (canonical: same data, same bytes). */
export async function collectChanges(db: CapstanDatabase, scope: ExportScope): Promise<CollectedChanges> {
  const tables = RECORD_KINDS.map((k) => tableOf(db, k));
  return db.transaction('r', [...tables, db.deviceSettings], async () => {
    const records = emptyRecords() as unknown as Record<RecordKind, RecordMeta[]>;
    let since: number | undefined;
    if (scope.kind === 'everything' || scope.kind === 'changes') {
      if (scope.kind === 'changes') since = (await loadPeer(db, scope.peerId))?.sentThrough;
      for (const kind of RECORD_KINDS) {
        const t = tableOf(db, kind);
        records[kind] =
          since === undefined ? await t.toArray() : await t.where('localSeq').above(since).toArray();
      }
    } else {
      const site = await db.sites.get(scope.siteId);
      if (!site) throw new Error(`Site ${scope.siteId} does not exist on this device`);
      const processes = await db.processes.where('siteId').equals(site.id).toArray();
      const processIds = processes.map((p) => p.id);
      const characteristics = await db.characteristics.where('processId').anyOf(processIds).toArray();
      records.sites = [site];
      records.processes = processes;
      records.characteristics = characteristics;
      records.studies = await db.studies
        .where('characteristicId')
        .anyOf(characteristics.map((c) => c.id))
        .toArray();
      records.projects = await db.projects.where('processId').anyOf(processIds).toArray();
      // Targets travel with every site file: the site judges its processes against the same profiles.
      records.contextProfiles = await db.contextProfiles.toArray();
    }
    let highWater = 0;
    for (const kind of RECORD_KINDS) {
      for (const r of records[kind]) if ((r.localSeq ?? 0) > highWater) highWater = r.localSeq ?? 0;
      records[kind] = records[kind].map(travelling).sort(compareById);
    }
    return { records: records as unknown as RecordsByKind, highWater, since };
  });
}

/** Remembers that a change set was prepared: the peer's checkpoint, and this device's last export time. */
export async function recordExport(
  db: CapstanDatabase,
  clock: HybridClock,
  at: string,
  collected: CollectedChanges,
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

/** A conflict as the preview lists it. */
export interface PlannedConflict {
  kind: RecordKind;
  decision: MergeDecision<RecordMeta>;
}

export interface ImportPlan {
  /** Every decision that writes or asks (unchanged records are only counted). */
  decisions: { kind: RecordKind; decision: MergeDecision<RecordMeta> }[];
  counts: Record<MergeKind, number>;
  countsByKind: Record<RecordKind, Record<MergeKind, number>>;
  conflicts: PlannedConflict[];
  /** Things worth knowing that do not stop the import (e.g. records whose parent has not arrived yet). */
  warnings: string[];
  /** Latest clock stamp in the change set, for this device's clock. */
  latestStamp?: string;
}

const zeroCounts = (): Record<MergeKind, number> => ({
  new: 0,
  updated: 0,
  deleted: 0,
  unchanged: 0,
  conflict: 0
});

/** References each kind holds, checked for "parent not on this device yet". */
const PARENT: Partial<Record<RecordKind, { field: string; kind: RecordKind }>> = {
  processes: { field: 'siteId', kind: 'sites' },
  characteristics: { field: 'processId', kind: 'processes' },
  studies: { field: 'characteristicId', kind: 'characteristics' },
  projects: { field: 'processId', kind: 'processes' }
};

/** Thrown when a change set cannot be merged at all (nothing has been written). */
export class ChangeSetRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ChangeSetRefused';
  }
}

/**
 * Works out, without writing, what merging a change set would do to every record. Refuses (ChangeSetRefused)
 * an id that this device holds as a different kind of record.
 */
export async function previewChangeSet(db: CapstanDatabase, records: RecordsByKind): Promise<ImportPlan> {
  const tables = RECORD_KINDS.map((k) => tableOf(db, k));
  return db.transaction('r', tables, async () => {
    const plan: ImportPlan = {
      decisions: [],
      counts: zeroCounts(),
      countsByKind: Object.fromEntries(
        RECORD_KINDS.map((k) => [k, zeroCounts()])
      ) as ImportPlan['countsByKind'],
      conflicts: [],
      warnings: []
    };
    // Ids of the small kinds, to catch an id reused across kinds and references to missing parents.
    const localIds = new Map<RecordKind, Set<string>>();
    for (const kind of RECORD_KINDS) {
      if (kind === 'studies') continue;
      localIds.set(kind, new Set((await tableOf(db, kind).toCollection().primaryKeys()) as string[]));
    }
    const fileIds = new Map<RecordKind, Set<string>>(
      RECORD_KINDS.map((k) => [k, new Set((records[k] as RecordMeta[]).map((r) => r.id))])
    );
    const missingParents = new Map<RecordKind, number>();
    for (const kind of RECORD_KINDS) {
      const incoming = records[kind] as RecordMeta[];
      if (incoming.length === 0) continue;
      for (const other of RECORD_KINDS) {
        if (other === kind) continue;
        const clash =
          other === 'studies'
            ? (
                await tableOf(db, 'studies').bulkGet(kind === 'studies' ? [] : incoming.map((r) => r.id))
              ).find(Boolean)
            : incoming.find((r) => localIds.get(other)!.has(r.id));
        if (clash) {
          throw new ChangeSetRefused(
            `${KIND_LABEL[kind]} ${clash.id} in the file is a ${KIND_LABEL[other]} on this device: the file is not consistent with this data`
          );
        }
      }
      const locals = await tableOf(db, kind).bulkGet(incoming.map((r) => r.id));
      const parent = PARENT[kind];
      incoming.forEach((record, i) => {
        const decision = mergeRecord(locals[i], record);
        plan.counts[decision.kind] += 1;
        plan.countsByKind[kind][decision.kind] += 1;
        plan.latestStamp = laterStamp(plan.latestStamp, clockOf(record));
        if (decision.kind !== 'unchanged') plan.decisions.push({ kind, decision });
        if (decision.kind === 'conflict') plan.conflicts.push({ kind, decision });
        if (parent && record.deletedAt === undefined) {
          const ref = (record as unknown as Record<string, string>)[parent.field] as string;
          if (!fileIds.get(parent.kind)!.has(ref) && !localIds.get(parent.kind)!.has(ref)) {
            missingParents.set(kind, (missingParents.get(kind) ?? 0) + 1);
          }
        }
      });
    }
    for (const [kind, n] of missingParents) {
      plan.warnings.push(
        `${n} ${KIND_LABEL[kind]} record(s) refer to a ${KIND_LABEL[PARENT[kind]!.kind]} that is neither in the file nor on this device; they are kept and appear once that record arrives (import the earlier file from that device).`
      );
    }
    return plan;
  });
}

/** How conflicts are settled: one rule for all, with per-record choices taking precedence. */
export interface ConflictChoices {
  rule?: ConflictRule;
  perRecord?: Record<string, 'local' | 'incoming'>;
}

export interface ImportResult {
  counts: Record<MergeKind, number>;
  written: number;
}

/**
 * Writes a previewed merge in one transaction: all of it or nothing. Refuses when a conflict is left unsettled
 * or when a record changed on this device after the preview (preview again). Studies replaced by the file are
 * kept as revisions, so an import can be looked back on.
 */
export async function applyChangeSet(
  db: CapstanDatabase,
  plan: ImportPlan,
  choices: ConflictChoices,
  clock: HybridClock,
  source: { deviceId: string; name: string; at: string }
): Promise<ImportResult> {
  const unsettled = plan.conflicts.filter(
    (c) => !choices.perRecord?.[c.decision.incoming.id] && !choices.rule
  );
  if (unsettled.length > 0) {
    throw new ChangeSetRefused(
      `${unsettled.length} conflict(s) are not settled yet: choose a version for each, or a rule`
    );
  }
  const tables = RECORD_KINDS.map((k) => tableOf(db, k));
  return db.transaction('rw', [...tables, db.deviceSettings, db.studyRevisions], async () => {
    const byKind = new Map<RecordKind, MergeDecision<RecordMeta>[]>();
    for (const { kind, decision } of plan.decisions) {
      const list = byKind.get(kind) ?? [];
      list.push(decision);
      byKind.set(kind, list);
    }
    let written = 0;
    for (const kind of RECORD_KINDS) {
      const decisions = byKind.get(kind);
      if (!decisions) continue;
      const table = tableOf(db, kind);
      const now = await table.bulkGet(decisions.map((d) => d.incoming.id));
      const writes: RecordMeta[] = [];
      const revisions: { id: string; studyId: string; savedAt: string; reason: 'imported'; study: Study }[] =
        [];
      decisions.forEach((d, i) => {
        const current = now[i];
        const expected = d.local;
        const same =
          current === undefined
            ? expected === undefined
            : expected !== undefined &&
              canonicalJson(versionOf(current)) === canonicalJson(versionOf(expected));
        if (!same) {
          throw new ChangeSetRefused(
            `${KIND_LABEL[kind]} ${d.incoming.id} changed on this device after the preview; nothing was imported — preview the file again`
          );
        }
        let record = d.write;
        if (d.kind === 'conflict') {
          const pick = choices.perRecord?.[d.incoming.id];
          record = settleConflict(d, pick ?? choices.rule ?? 'newer');
        }
        if (!record) return;
        writes.push(record);
        if (kind === 'studies' && current && current.deletedAt === undefined) {
          revisions.push({
            id: crypto.randomUUID(),
            studyId: current.id,
            savedAt: source.at,
            reason: 'imported',
            study: current as Study
          });
        }
      });
      await table.bulkPut(writes);
      if (revisions.length > 0) await db.studyRevisions.bulkAdd(revisions);
      written += writes.length;
    }
    clock.observe(plan.latestStamp);
    await saveClock(db, clock);
    const known = (await loadPeer(db, source.deviceId)) ?? { deviceId: source.deviceId, name: source.name };
    await savePeer(db, { ...known, name: source.name || known.name, lastReceivedAt: source.at });
    return { counts: { ...plan.counts }, written };
  });
}
