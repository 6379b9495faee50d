import type { Dexie, Transaction } from 'dexie';
import { legacyStamp } from '../domain/hybrid-clock';
import type { Study } from '../domain/study';
import { shelfOf } from './study-shelf';

/**
 * Every schema version the app has shipped, oldest first. A version that has shipped is never edited:
 * a change is a new version with its own upgrade and its own test (see migration.spec.ts).
 *
 * Index strings are Dexie's: the first entry is the primary key, `[a+b]` a compound index.
 */

/** v1: the first release. Characteristics had no risk class yet. */
export const SCHEMA_V1 = {
  sites: 'id, name, updatedAt',
  processes: 'id, siteId, updatedAt',
  characteristics: 'id, processId, updatedAt',
  studies: 'id, characteristicId, period, updatedAt',
  projects: 'id, processId, updatedAt',
  deviceSettings: 'key'
} as const;

/**
 * v2: studies get a compound index on characteristic and period (one month of one characteristic is looked up
 * on every log entry and replace-or-combine decision), processes an index on their industry context, and every
 * characteristic a risk class — records written by v1 become `standard`, the class v1 implied.
 */
export const SCHEMA_V2 = {
  processes: 'id, siteId, contextId, updatedAt',
  studies: 'id, characteristicId, period, updatedAt, [characteristicId+period]'
} as const;

export async function upgradeToV2(tx: Transaction): Promise<void> {
  await tx
    .table('characteristics')
    .toCollection()
    .modify((characteristic: Record<string, unknown>) => {
      if (characteristic.riskClass === undefined) characteristic.riskClass = 'standard';
    });
}

/**
 * v3: two device-local tables for monthly logging. `entryDrafts` keeps what is being typed into an entry form
 * (keyed by characteristic and month) so that a closed tab loses nothing; `studyRevisions` keeps the earlier
 * version of a study each time it is replaced or combined, so that the person can restore it. No data change.
 */
export const SCHEMA_V3 = {
  entryDrafts: 'key, updatedAt',
  studyRevisions: 'id, studyId, savedAt'
} as const;

/** v4: the manager's edited (or own) industry-context profiles, synchronised records like the others. */
export const SCHEMA_V4 = {
  contextProfiles: 'id, contextId, updatedAt'
} as const;

/**
 * v5: file exchange. Every synchronised record gets a version vector and a hybrid-clock stamp (records of
 * v1–v4 get the ones their `rev`, writer and update time imply, so nothing they say changes), and an indexed,
 * device-local write sequence `localSeq` so that "everything changed since the last file sent to X" is an
 * index range, not a scan. Records of v1–v4 get their update time as sequence: all count as not yet sent.
 */
export const SCHEMA_V5 = {
  sites: 'id, name, updatedAt, localSeq',
  processes: 'id, siteId, contextId, updatedAt, localSeq',
  characteristics: 'id, processId, updatedAt, localSeq',
  studies: 'id, characteristicId, period, updatedAt, [characteristicId+period], localSeq',
  projects: 'id, processId, updatedAt, localSeq',
  contextProfiles: 'id, contextId, updatedAt, localSeq'
} as const;

export async function upgradeToV5(tx: Transaction): Promise<void> {
  for (const name of Object.keys(SCHEMA_V5)) {
    await tx
      .table(name)
      .toCollection()
      .modify((r: Record<string, unknown>) => {
        const deviceId = String(r.deviceId);
        if (r.vv === undefined) r.vv = { [deviceId]: Number(r.rev) || 1 };
        if (r.clock === undefined) r.clock = legacyStamp(String(r.updatedAt), deviceId);
        if (r.localSeq === undefined) r.localSeq = Date.parse(String(r.updatedAt)) || 0;
      });
  }
}

/** v6: quarterly reviews (section notes and frozen figures), synchronised records like the others. */
export const SCHEMA_V6 = {
  reviews: 'id, quarter, updatedAt, localSeq'
} as const;

/**
 * v7: one live study per characteristic and month. Before v7 a month logged on two devices could arrive as two
 * live studies. The upgrade keeps both and records each such month in the device-local table `monthClashes`
 * (a pending conflict): a person chooses which study to keep, or combines them, on the File exchange page;
 * until then the figures use the more recently edited of the two (never both pooled).
 */
export const SCHEMA_V7 = {
  monthClashes: 'key, detectedAt'
} as const;

export async function upgradeToV7(tx: Transaction): Promise<void> {
  const byMonth = new Map<string, string[]>();
  await tx
    .table('studies')
    .toCollection()
    .each((s: { id: string; characteristicId: string; period: string; deletedAt?: string }) => {
      if (s.deletedAt !== undefined) return;
      const key = `${s.characteristicId}|${s.period}`;
      const list = byMonth.get(key);
      if (list) list.push(s.id);
      else byMonth.set(key, [s.id]);
    });
  const detectedAt = new Date().toISOString();
  const rows = [...byMonth]
    .filter(([, ids]) => ids.length > 1)
    .map(([key, ids]) => ({ key, studyIds: ids.sort(), detectedAt }));
  if (rows.length > 0) await tx.table('monthClashes').bulkPut(rows);
}

/**
 * v8: the portfolio's read model (domain/monthly-statistics.ts) kept between visits, device-local. It is derived
 * from the studies and rebuilt from them whenever it cannot be trusted, so no upgrade fills it.
 */
export const SCHEMA_V8 = {
  readModels: 'key'
} as const;

/**
 * v9: studies lose two indexes no query needs — `characteristicId`, whose queries the compound
 * `[characteristicId+period]` answers as a range of its first part (storage/records-under.ts), and `updatedAt`,
 * which nothing reads. Each index is one more entry IndexedDB writes per study: 72 000 studies written in one
 * transaction in headless Chromium took 5.0 s without indexes, 7.4 s with three and 8.9 s with the five of v8.
 * Dexie drops the two indexes; no record changes.
 */
export const SCHEMA_V9 = {
  studies: 'id, period, [characteristicId+period], localSeq'
} as const;

/**
 * v10: studies are kept on shelves, one record per characteristic holding every study of it, live and deleted
 * (storage/study-shelves.ts). IndexedDB costs some 0.1 ms a record written in Chromium whatever the record holds:
 * 72 000 studies put in one transaction took 6.3–6.7 s as one record each (7.0–7.6 s without any index), and
 * 0.34–0.38 s as 2 000 shelves of 36 (measured on 2026-12-04 in headless Chromium, an ad-hoc page writing the
 * same records both ways). The upgrade moves every study onto its shelf, keeping its write sequence, and drops the stored
 * read model (derived: rebuilt on the next visit). v11 deletes the emptied table.
 *
 * The other kinds lose the indexes no query reads (`updatedAt` everywhere, a site's `name`, a process's
 * `contextId`): each is one more entry written per record, some 10 µs each in the measurement of v9 below, and a
 * company's file writes 2 000 processes and 2 000 characteristics or more. Dexie drops them; no record changes.
 */
export const SCHEMA_V10 = {
  sites: 'id, localSeq',
  processes: 'id, siteId, localSeq',
  characteristics: 'id, processId, localSeq',
  projects: 'id, processId, localSeq',
  studyShelves: 'characteristicId, localSeq'
} as const;

export async function upgradeToV10(tx: Transaction): Promise<void> {
  const byCharacteristic = new Map<string, Study[]>();
  await tx
    .table('studies')
    .toCollection()
    .each((s: Study) => {
      const list = byCharacteristic.get(s.characteristicId);
      if (list) list.push(s);
      else byCharacteristic.set(s.characteristicId, [s]);
    });
  const shelves = [...byCharacteristic].map(([id, studies]) => shelfOf(id, studies));
  if (shelves.length > 0) await tx.table('studyShelves').bulkPut(shelves);
  await tx.table('readModels').clear();
}

export const SCHEMA_V11 = {
  studies: null
} as const;

export const CURRENT_SCHEMA_VERSION = 11;

/** Declares all versions on a database instance, in order. */
export function declareSchemaVersions(db: Dexie): void {
  db.version(1).stores(SCHEMA_V1);
  db.version(2).stores(SCHEMA_V2).upgrade(upgradeToV2);
  db.version(3).stores(SCHEMA_V3);
  db.version(4).stores(SCHEMA_V4);
  db.version(5).stores(SCHEMA_V5).upgrade(upgradeToV5);
  db.version(6).stores(SCHEMA_V6);
  db.version(7).stores(SCHEMA_V7).upgrade(upgradeToV7);
  db.version(8).stores(SCHEMA_V8);
  db.version(9).stores(SCHEMA_V9);
  db.version(10).stores(SCHEMA_V10).upgrade(upgradeToV10);
  db.version(11).stores(SCHEMA_V11);
}
