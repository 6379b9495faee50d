import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ValidationError } from '../domain/validation-error';
import { openStorage, type CapstanStorage, databaseOf } from './storage';
import { allStudies, findStudy } from './study-shelves';

let storage: CapstanStorage;
let dbName: string;
let counter = 0;

beforeEach(async () => {
  counter += 1;
  dbName = `capstan-test-${counter}`;
  storage = await openStorage(dbName);
});

afterEach(async () => {
  databaseOf(storage).close();
  await databaseOf(storage).delete();
});

/** Every row of every table, tombstones included: what "unchanged" is measured against. */
async function everything(s: CapstanStorage) {
  const d = databaseOf(s);
  return {
    sites: await d.sites.toArray(),
    processes: await d.processes.toArray(),
    characteristics: await d.characteristics.toArray(),
    studies: await allStudies(d),
    projects: await d.projects.toArray()
  };
}

async function seedProcess(s: CapstanStorage) {
  const site = await s.sites.create({ name: 'Plant East', region: 'Nordics', timeZone: 'Europe/Oslo' });
  const process = await s.processes.create({
    siteId: site.id,
    name: 'Shaft turning',
    owner: 'K. Lund',
    contextId: 'vehicle-parts',
    monthlyVolume: 10_000,
    costPerDefective: 12,
    currency: 'EUR'
  });
  const characteristic = await s.characteristics.create({
    processId: process.id,
    name: 'Shaft diameter',
    unit: 'mm',
    dataKind: 'measured',
    lsl: 19.98,
    usl: 20.02,
    riskClass: 'key'
  });
  return { site, process, characteristic };
}

describe('repositories', () => {
  it('creates records with bookkeeping and reads them back', async () => {
    const { site, characteristic } = await seedProcess(storage);
    expect(site.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(site.rev).toBe(1);
    expect(site.deviceId).toBe(storage.deviceId);
    expect(await storage.sites.get(site.id)).toMatchObject(site);
    expect((await storage.characteristics.list()).map((c) => c.name)).toEqual([characteristic.name]);
  });

  it('keeps the device id across reopening', async () => {
    const id = storage.deviceId;
    storage.close();
    storage = await openStorage(dbName);
    expect(storage.deviceId).toBe(id);
  });

  it('updates as a new revision', async () => {
    const { site } = await seedProcess(storage);
    const updated = await storage.sites.update(site.id, {
      name: 'Plant East 2',
      region: 'Nordics',
      timeZone: 'Europe/Oslo'
    });
    expect(updated.rev).toBe(2);
    expect(updated.createdAt).toBe(site.createdAt);
    expect((await storage.sites.get(site.id))?.name).toBe('Plant East 2');
  });

  it('refuses bad input and leaves every table unchanged', async () => {
    const { process, characteristic } = await seedProcess(storage);
    const before = await everything(storage);
    const attempts: (() => Promise<unknown>)[] = [
      () =>
        storage.characteristics.create({
          processId: process.id,
          name: 'x',
          unit: '',
          dataKind: 'measured',
          lsl: 5,
          usl: 4,
          riskClass: 'standard'
        }),
      () =>
        storage.studies.create({
          characteristicId: characteristic.id,
          period: '2026-3',
          data: { kind: 'raw', values: [1] },
          enteredBy: ''
        }),
      () =>
        storage.studies.create({
          characteristicId: characteristic.id,
          period: '2026-03',
          data: { kind: 'raw', values: [20, 'x'] },
          enteredBy: ''
        }),
      () => storage.characteristics.update(characteristic.id, { ...characteristic, lsl: 30 })
    ];
    for (const attempt of attempts) await expect(attempt()).rejects.toBeInstanceOf(ValidationError);
    expect(await everything(storage)).toEqual(before);
  });

  it('refuses references to missing records', async () => {
    await expect(
      storage.processes.create({
        siteId: '00000000-0000-4000-8000-000000000000',
        name: 'Orphan',
        owner: '',
        contextId: 'vehicle-parts',
        monthlyVolume: 1,
        costPerDefective: 1,
        currency: 'EUR'
      })
    ).rejects.toThrow(/Site 00000000-0000-4000-8000-000000000000 does not exist/);
  });

  it('refuses counted data on a measured characteristic', async () => {
    const { characteristic } = await seedProcess(storage);
    await expect(
      storage.studies.create({
        characteristicId: characteristic.id,
        period: '2026-03',
        data: { kind: 'defectives', units: 10, defectives: 1 },
        enteredBy: ''
      })
    ).rejects.toThrow(/measured characteristic; defectives data does not fit/);
  });

  it('refuses a second study for the same characteristic and month', async () => {
    const { characteristic } = await seedProcess(storage);
    const first = {
      characteristicId: characteristic.id,
      period: '2026-03',
      data: { kind: 'summary', n: 30, mean: 20, sd: 0.005 },
      enteredBy: 'A'
    };
    await storage.studies.create(first);
    await expect(storage.studies.create(first)).rejects.toThrow(/already has a study for 2026-03/);
    expect(await storage.studies.forCharacteristic(characteristic.id)).toHaveLength(1);
  });

  it('deletes by tombstone and restores', async () => {
    const { site } = await seedProcess(storage);
    const tombstone = await storage.sites.remove(site.id);
    expect(tombstone.deletedAt).toBeDefined();
    expect(await storage.sites.get(site.id)).toBeUndefined();
    expect(await databaseOf(storage).sites.get(site.id)).toMatchObject({ id: site.id, rev: 2 });
    await storage.sites.restore(site.id);
    expect((await storage.sites.get(site.id))?.rev).toBe(3);
  });

  it('cascades a site deletion to everything beneath it, and undo brings back exactly that', async () => {
    const { site, process, characteristic } = await seedProcess(storage);
    await storage.studies.create({
      characteristicId: characteristic.id,
      period: '2026-02',
      data: { kind: 'raw', values: [20, 20.01] },
      enteredBy: ''
    });
    const earlier = await storage.studies.create({
      characteristicId: characteristic.id,
      period: '2026-01',
      data: { kind: 'raw', values: [20] },
      enteredBy: ''
    });
    await storage.studies.remove(earlier.id); // deleted before the site: must stay deleted after undo
    const removal = await storage.sites.removeWithContents(site.id);
    expect(removal.counts).toEqual({ processes: 1, characteristics: 1, studies: 1, projects: 0 });
    expect(await storage.processes.get(process.id)).toBeUndefined();
    expect(await storage.studies.list()).toHaveLength(0);
    await storage.sites.undoRemoval(removal);
    expect(await storage.processes.get(process.id)).toBeDefined();
    expect((await storage.studies.list()).map((s) => s.period)).toEqual(['2026-02']);
  });

  it('keeps a record deleted on its own apart from a site deletion in the same millisecond', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-05-04T10:00:00.000Z'));
    try {
      const { site, characteristic } = await seedProcess(storage);
      const alone = await storage.studies.create({
        characteristicId: characteristic.id,
        period: '2026-01',
        data: { kind: 'raw', values: [20] },
        enteredBy: ''
      });
      await storage.studies.remove(alone.id);
      const removal = await storage.sites.removeWithContents(site.id);
      expect(removal.deletedAt).not.toBe((await findStudy(databaseOf(storage), alone.id))!.deletedAt);
      await storage.sites.undoRemoval(removal);
      expect(await storage.studies.get(alone.id)).toBeUndefined();
    } finally {
      vi.useRealTimers();
    }
  });
});

describe('edits from a stale form', () => {
  it('refuses an update whose starting revision is no longer the stored one, writing nothing', async () => {
    const { EditConflictError } = await import('./record-repository');
    const site = await storage.sites.create({ name: 'Dockside', region: '', timeZone: 'UTC' });
    await storage.sites.update(site.id, { name: 'Dockside East', region: '', timeZone: 'UTC' }, site.rev);
    await expect(
      storage.sites.update(site.id, { name: 'Dockside West', region: '', timeZone: 'UTC' }, site.rev)
    ).rejects.toBeInstanceOf(EditConflictError);
    expect((await storage.sites.get(site.id))?.name).toBe('Dockside East');
    const profileRev = await storage.profiles.revisionOf('vehicle-parts');
    expect(profileRev).toBe(0);
    const [vehicle] = (await storage.profiles.effective()).filter((p) => p.id === 'vehicle-parts');
    const { id, ...rest } = vehicle!;
    await storage.profiles.save({ ...rest, contextId: id }, 0);
    await expect(storage.profiles.save({ ...rest, contextId: id, label: 'Stale' }, 0)).rejects.toBeInstanceOf(
      EditConflictError
    );
  });
});
