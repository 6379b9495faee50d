import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import { stampNew } from '../domain/record-meta';
import { openStorage, type CapstanStorage, databaseOf } from './storage';
import { findStudy, putStudies } from './study-shelves';

let storage: CapstanStorage | undefined;
afterEach(async () => {
  if (storage) {
    databaseOf(storage).close();
    await databaseOf(storage).delete();
  }
  storage = undefined;
});

/** Two live studies of one month written straight into the table, as a database from before v7 may hold. */
async function withPendingMonth() {
  storage = await openStorage(`month-clash-${Math.random().toString(36).slice(2)}`);
  const site = await storage.sites.create({ name: 'Calder Mill', region: '', timeZone: 'UTC' });
  const process = await storage.processes.create({
    siteId: site.id,
    name: 'Spinning',
    owner: '',
    contextId: 'vehicle-parts',
    monthlyVolume: 1000,
    costPerDefective: 2,
    currency: 'EUR'
  });
  const ch = await storage.characteristics.create({
    processId: process.id,
    name: 'Yarn count',
    unit: 'tex',
    dataKind: 'measured',
    lsl: 9,
    usl: 11,
    riskClass: 'standard'
  });
  const ctx = (deviceId: string) => ({
    deviceId,
    now: () => new Date('2026-03-04T08:00:00Z'),
    newId: () => crypto.randomUUID()
  });
  const a = stampNew(
    {
      characteristicId: ch.id,
      period: '2026-02',
      data: { kind: 'summary' as const, n: 30, mean: 10.1, sd: 0.2 },
      enteredBy: 'site lead'
    },
    ctx('site-lead')
  );
  const b = stampNew(
    {
      characteristicId: ch.id,
      period: '2026-02',
      data: { kind: 'summary' as const, n: 20, mean: 10.3, sd: 0.3 },
      enteredBy: 'office'
    },
    ctx('office')
  );
  await putStudies(databaseOf(storage), [a, b]);
  await databaseOf(storage).monthClashes.add({
    key: `${ch.id}|2026-02`,
    studyIds: [a.id, b.id].sort(),
    detectedAt: '2026-03-05T00:00:00.000Z'
  });
  return { s: storage, ch, a, b };
}

describe('months logged twice before v7', () => {
  it('are listed with both studies, and the figures use one of them, never both pooled', async () => {
    const { s, ch } = await withPendingMonth();
    const pending = await s.monthClashes.list();
    expect(pending).toHaveLength(1);
    expect(pending[0]!.studies.map((x) => x.data)).toHaveLength(2);
    const detail = await s.read.processDetail(ch.processId);
    expect(detail!.characteristics[0]!.studies).toHaveLength(1);
    expect((await s.read.portfolioRecords()).studies).toHaveLength(1);
  });

  it('keeping one deletes the other as a revision that travels', async () => {
    const { s, a, b } = await withPendingMonth();
    await s.monthClashes.settle((await s.monthClashes.list())[0]!.key, { keep: b.id });
    expect(await s.studies.get(b.id)).toBeDefined();
    expect(await s.studies.get(a.id)).toBeUndefined();
    expect((await findStudy(databaseOf(s), a.id))!.deletedAt).toBeDefined();
    expect(await s.monthClashes.list()).toHaveLength(0);
  });

  it('combining pools both exactly into the study with the lower id', async () => {
    const { s, a, b } = await withPendingMonth();
    await s.monthClashes.settle((await s.monthClashes.list())[0]!.key, { combine: true });
    const [low, high] = [a, b].sort((x, y) => (x.id < y.id ? -1 : 1));
    const kept = await s.studies.get(low!.id);
    expect(kept!.data).toMatchObject({ kind: 'summary', n: 50 });
    // Pooled mean of 30 at 10.1 and 20 at 10.3 (Chan, Golub & LeVeque): (30·10.1 + 20·10.3)/50 = 10.18.
    expect((kept!.data as { mean: number }).mean).toBeCloseTo(10.18, 12);
    expect(await s.studies.get(high!.id)).toBeUndefined();
  });
});
