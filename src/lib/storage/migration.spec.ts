import 'fake-indexeddb/auto';
import { Dexie } from 'dexie';
import { describe, expect, it } from 'vitest';
import { CapstanDatabase } from './database';
import {
  CURRENT_SCHEMA_VERSION,
  SCHEMA_V1,
  SCHEMA_V2,
  SCHEMA_V3,
  SCHEMA_V4,
  SCHEMA_V5,
  SCHEMA_V6,
  SCHEMA_V7,
  SCHEMA_V8,
  SCHEMA_V9
} from './schema-versions';
import { recordsUnder } from './records-under';
import { allStudies, findStudy, studiesOf } from './study-shelves';

/** A database as version `version` of the app shipped it: the schemas of that version and those before it. */
function databaseAsShipped(name: string, version: number): Dexie {
  const db = new Dexie(name);
  [SCHEMA_V1, SCHEMA_V2, SCHEMA_V3, SCHEMA_V4, SCHEMA_V5, SCHEMA_V6, SCHEMA_V7, SCHEMA_V8, SCHEMA_V9]
    .slice(0, version)
    .forEach((schema, i) => db.version(i + 1).stores(schema));
  return db;
}

/** A one-month summary study with the bookkeeping v5 and later store (written once, by `deviceId`). */
function storedStudy(s: {
  id: string;
  characteristicId: string;
  period: string;
  deviceId?: string;
  mean?: number;
  deletedAt?: string | undefined;
}) {
  const deviceId = s.deviceId ?? 'dev';
  return {
    id: s.id,
    createdAt: '2026-03-04T00:00:00.000Z',
    updatedAt: '2026-03-04T00:00:00.000Z',
    rev: 1,
    deviceId,
    vv: { [deviceId]: 1 },
    clock: `1772582400000-0000-${deviceId}`,
    localSeq: 1,
    characteristicId: s.characteristicId,
    period: s.period,
    data: { kind: 'summary', n: 30, mean: s.mean ?? 10, sd: 1 },
    enteredBy: deviceId,
    ...(s.deletedAt ? { deletedAt: s.deletedAt } : {})
  };
}

/**
 * Opens a database as schema v1 shipped it, fills it with v1-shaped records, then reopens it with the
 * current app and checks that every record survived and the v2 upgrade did its work.
 */
describe('schema upgrade v1 → v2', () => {
  it('keeps every record and fills in what v2 added', async () => {
    const name = 'capstan-migration-test';
    const v1 = new Dexie(name);
    v1.version(1).stores(SCHEMA_V1);
    await v1.open();
    const meta = (id: string) => ({
      id,
      createdAt: '2025-01-01T00:00:00.000Z',
      updatedAt: '2025-01-01T00:00:00.000Z',
      rev: 1,
      deviceId: 'dev-v1'
    });
    const site = {
      ...meta('11111111-1111-4111-8111-111111111111'),
      name: 'Old plant',
      region: '',
      timeZone: 'UTC'
    };
    const process = {
      ...meta('22222222-2222-4222-8222-222222222222'),
      siteId: site.id,
      name: 'Moulding',
      owner: '',
      contextId: 'medical-devices',
      monthlyVolume: 100,
      costPerDefective: 1,
      currency: 'USD'
    };
    // v1 had no risk class on characteristics.
    const characteristics = [
      {
        ...meta('33333333-3333-4333-8333-333333333333'),
        processId: process.id,
        name: 'Wall',
        unit: 'mm',
        dataKind: 'measured',
        lsl: 1,
        usl: 2
      },
      {
        ...meta('44444444-4444-4444-8444-444444444444'),
        processId: process.id,
        name: 'Flash',
        unit: '',
        dataKind: 'counted'
      }
    ];
    const studies = Array.from({ length: 30 }, (_, i) => ({
      ...meta(`55555555-5555-4555-8555-${String(i).padStart(12, '0')}`),
      characteristicId: characteristics[0]!.id,
      period: `2024-${String((i % 12) + 1).padStart(2, '0')}`,
      data: { kind: 'raw', values: [1.5 + i / 1000, 1.51] },
      enteredBy: 'v1 user'
    }));
    const tombstone = {
      ...studies[0]!,
      id: '66666666-6666-4666-8666-666666666666',
      deletedAt: '2025-02-01T00:00:00.000Z',
      rev: 2
    };
    await v1.table('sites').add(site);
    await v1.table('processes').add(process);
    await v1.table('characteristics').bulkAdd(characteristics);
    await v1.table('studies').bulkAdd([...studies, tombstone]);
    await v1.table('deviceSettings').put({ key: 'deviceId', value: 'dev-v1' });
    v1.close();

    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    expect(await current.sites.toArray()).toMatchObject([site]);
    expect(await current.processes.toArray()).toMatchObject([process]);
    const upgraded = await current.characteristics.orderBy('id').toArray();
    expect(upgraded).toMatchObject(characteristics.map((c) => ({ ...c, riskClass: 'standard' })));
    expect(await allStudies(current)).toHaveLength(31);
    expect(await findStudy(current, tombstone.id)).toMatchObject(tombstone);
    // A characteristic's month is found (by v2's compound index then, on its shelf since v10).
    const march = (await studiesOf(current, characteristics[0]!.id)).filter((s) => s.period === '2024-03');
    expect(march.map((s) => s.id).sort()).toEqual([studies[2]!.id, studies[14]!.id, studies[26]!.id].sort());
    expect((await current.deviceSettings.get('deviceId'))?.value).toBe('dev-v1');
    current.close();
    await Dexie.delete(name);
  });
});

describe('schema upgrade v2 → v3', () => {
  it('adds the draft and revision tables and leaves every record as it was', async () => {
    const name = 'capstan-migration-v3';
    const v2 = new Dexie(name);
    v2.version(1).stores(SCHEMA_V1);
    v2.version(2).stores(SCHEMA_V2);
    await v2.open();
    const study = {
      id: '77777777-7777-4777-8777-777777777777',
      createdAt: '2026-01-05T00:00:00.000Z',
      updatedAt: '2026-01-05T00:00:00.000Z',
      rev: 4,
      deviceId: 'dev-v2',
      characteristicId: '33333333-3333-4333-8333-333333333333',
      period: '2025-12',
      data: { kind: 'summary', n: 30, mean: 1, sd: 0.1 },
      enteredBy: 'v2 user'
    };
    await v2.table('studies').add(study);
    v2.close();
    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    expect(await allStudies(current)).toMatchObject([study]);
    expect(await current.entryDrafts.count()).toBe(0);
    await current.studyRevisions.add({
      id: 'r1',
      studyId: study.id,
      savedAt: '2026-02-01T00:00:00.000Z',
      reason: 'replaced',
      study: study as never
    });
    expect(await current.studyRevisions.where('studyId').equals(study.id).count()).toBe(1);
    current.close();
    await Dexie.delete(name);
  });
});

describe('schema upgrade v3 → v4', () => {
  it('adds the context-profile table and keeps drafts and revisions', async () => {
    const name = 'capstan-migration-v4';
    const v3 = new Dexie(name);
    v3.version(1).stores(SCHEMA_V1);
    v3.version(2).stores(SCHEMA_V2);
    v3.version(3).stores(SCHEMA_V3);
    await v3.open();
    await v3
      .table('entryDrafts')
      .put({ key: 'c|2026-01', form: { n: '5' }, updatedAt: '2026-01-02T00:00:00.000Z' });
    v3.close();
    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    expect((await current.entryDrafts.get('c|2026-01'))?.form).toEqual({ n: '5' });
    expect(await current.contextProfiles.count()).toBe(0);
    current.close();
    await Dexie.delete(name);
  });
});

describe('schema upgrade v4 → v5', () => {
  it('gives every record the version, clock and write sequence its v4 bookkeeping implies', async () => {
    const name = 'capstan-migration-v5';
    const v4 = new Dexie(name);
    v4.version(1).stores(SCHEMA_V1);
    v4.version(2).stores(SCHEMA_V2);
    v4.version(3).stores(SCHEMA_V3);
    v4.version(4).stores(SCHEMA_V4);
    await v4.open();
    const site = {
      id: '88888888-8888-4888-8888-888888888888',
      createdAt: '2026-01-05T00:00:00.000Z',
      updatedAt: '2026-03-05T10:00:00.000Z',
      rev: 3,
      deviceId: 'dev-v4',
      name: 'Plant',
      region: '',
      timeZone: 'UTC'
    };
    await v4.table('sites').add(site);
    v4.close();
    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    const upgraded = await current.sites.get(site.id);
    expect(upgraded).toMatchObject({ ...site, vv: { 'dev-v4': 3 }, clock: '1772704800000-0000-dev-v4' });
    expect(typeof upgraded?.localSeq).toBe('number');
    // The sequence index answers "changed since".
    expect(await current.sites.where('localSeq').above(0).count()).toBe(1);
    // New writes continue above every stored sequence value.
    expect(current.sequence.latest).toBeGreaterThanOrEqual(upgraded!.localSeq!);
    current.close();
    await Dexie.delete(name);
  });
});

describe('schema upgrade v5 → v6', () => {
  it('adds the quarterly-review table and keeps every record', async () => {
    const name = 'capstan-migration-v6';
    const v5 = new Dexie(name);
    v5.version(1).stores(SCHEMA_V1);
    v5.version(2).stores(SCHEMA_V2);
    v5.version(3).stores(SCHEMA_V3);
    v5.version(4).stores(SCHEMA_V4);
    v5.version(5).stores(SCHEMA_V5);
    await v5.open();
    const site = {
      id: '99999999-9999-4999-8999-999999999999',
      createdAt: '2026-01-05T00:00:00.000Z',
      updatedAt: '2026-01-05T00:00:00.000Z',
      rev: 1,
      deviceId: 'dev-v5',
      vv: { 'dev-v5': 1 },
      clock: '1767571200000-0000-dev-v5',
      localSeq: 5,
      name: 'Plant',
      region: '',
      timeZone: 'UTC'
    };
    await v5.table('sites').add(site);
    v5.close();
    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    expect(await current.sites.get(site.id)).toEqual(site);
    expect(await current.reviews.count()).toBe(0);
    current.close();
    await Dexie.delete(name);
  });
});

describe('schema upgrade v6 → v7', () => {
  it('turns two live studies of one month into a pending conflict and drops neither', async () => {
    const name = 'capstan-migration-v7';
    const v6 = databaseAsShipped(name, 6);
    await v6.open();
    const characteristicId = '11111111-1111-4111-8111-111111111111';
    const study = (id: string, deviceId: string, mean: number, deletedAt?: string) =>
      storedStudy({ id, characteristicId, period: '2026-02', deviceId, mean, deletedAt });
    const rows = [
      study('aaaaaaaa-0000-4000-8000-000000000001', 'site-lead', 10.1),
      study('aaaaaaaa-0000-4000-8000-000000000002', 'office', 10.3),
      study('aaaaaaaa-0000-4000-8000-000000000003', 'office', 9.9, '2026-03-05T00:00:00.000Z')
    ];
    await v6.table('studies').bulkAdd(rows);
    v6.close();
    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    expect(await allStudies(current)).toHaveLength(3);
    for (const r of rows) expect(await findStudy(current, r.id)).toEqual(r);
    expect(await current.monthClashes.toArray()).toEqual([
      {
        key: '11111111-1111-4111-8111-111111111111|2026-02',
        studyIds: ['aaaaaaaa-0000-4000-8000-000000000001', 'aaaaaaaa-0000-4000-8000-000000000002'],
        detectedAt: expect.any(String)
      }
    ]);
    current.close();
    await Dexie.delete(name);
  });
});

describe('schema upgrade v8 → v9 (and on to shelves)', () => {
  it('keeps every study, and still finds the studies of each characteristic', async () => {
    const name = 'capstan-migration-v9';
    const v8 = databaseAsShipped(name, 8);
    await v8.open();
    // 'c1' is a prefix of 'c10': a range of the compound index's first part must not run from one into the other.
    const study = (id: string, characteristicId: string, period: string, deletedAt?: string) =>
      storedStudy({ id, characteristicId, period, deletedAt });
    const rows = [
      study('s1', 'c1', '2024-01'),
      study('s2', 'c1', '2026-12', '2026-03-05T00:00:00.000Z'),
      study('s3', 'c10', '2025-06'),
      study('s4', 'c2', '2025-06'),
      study('s5', 'c0', '2025-06')
    ];
    await v8.table('studies').bulkAdd(rows);
    v8.close();
    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    for (const r of rows) expect(await findStudy(current, r.id)).toEqual(r);
    const idsUnder = async (parents: string[]) =>
      (await recordsUnder(current, 'studies', parents)).map((r) => r.id).sort();
    expect(await idsUnder(['c1'])).toEqual(['s1', 's2']);
    expect(await idsUnder(['c10', 'c2'])).toEqual(['s3', 's4']);
    expect(await idsUnder(['c9'])).toEqual([]);
    expect(await idsUnder([])).toEqual([]);
    current.close();
    await Dexie.delete(name);
  });
});

describe('schema upgrade v9 → v10 and v11 (studies onto shelves)', () => {
  it('puts every study on the shelf of its characteristic as it was, drops the studies table and the stored read model', async () => {
    const name = 'capstan-migration-v10';
    const v9 = databaseAsShipped(name, 9);
    await v9.open();
    const study = (
      id: string,
      characteristicId: string,
      period: string,
      localSeq: number,
      deletedAt?: string
    ) => ({
      ...storedStudy({ id, characteristicId, period, deletedAt }),
      localSeq
    });
    const rows = [
      study('s3', 'c1', '2026-02', 30),
      study('s1', 'c1', '2026-01', 50),
      study('s2', 'c1', '2026-01', 20, '2026-03-05T00:00:00.000Z'),
      study('s4', 'c2', '2025-06', 40)
    ];
    await v9.table('studies').bulkAdd(rows);
    await v9.table('readModels').put({ key: 'monthly-statistics', format: 3 });
    const process = {
      id: 'p1',
      siteId: 's1',
      contextId: 'x',
      name: 'Line 1',
      updatedAt: '2026-03-04',
      localSeq: 7
    };
    await v9.table('processes').add(process);
    v9.close();
    const current = new CapstanDatabase(name);
    await current.open();
    expect(current.verno).toBe(CURRENT_SCHEMA_VERSION);
    expect(current.tables.map((t) => t.name)).not.toContain('studies');
    const shelves = await current.studyShelves.toArray();
    // Each shelf in month order then by id, with its size and the highest write sequence of its studies.
    expect(shelves).toEqual([
      { characteristicId: 'c1', studies: [rows[1], rows[2], rows[0]], localSeq: 50, size: 3 },
      { characteristicId: 'c2', studies: [rows[3]], localSeq: 40, size: 1 }
    ]);
    expect(await current.readModels.count()).toBe(0);
    // Indexes no query reads are gone; the records stay as they were, and a site's processes are still found.
    const indexes = (table: { schema: { indexes: { name: string }[] } }) =>
      table.schema.indexes.map((i) => i.name).sort();
    expect(indexes(current.processes)).toEqual(['localSeq', 'siteId']);
    expect(indexes(current.sites)).toEqual(['localSeq']);
    expect(await current.processes.where('siteId').equals('s1').toArray()).toEqual([process]);
    // The write sequence goes on above the highest value a study carried.
    expect(current.sequence.latest).toBeGreaterThanOrEqual(50);
    current.close();
    await Dexie.delete(name);
  });
});
