import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ValidationError } from '../domain/validation-error';
import { EditConflictError, RecordNotFoundError } from './record-repository';
import { LIST_SLICE } from './records-in-slices';
import { databaseOf, openStorage, type CapstanStorage } from './storage';

/** The generic repository through one kind (sites): validate first, one transaction, tombstones and undo. */
let s: CapstanStorage;
beforeEach(async () => {
  s = await openStorage(`record-repository-${Math.random().toString(36).slice(2)}`);
});
afterEach(async () => {
  databaseOf(s).close();
  await databaseOf(s).delete();
});

describe('record repository', () => {
  it('creates, updates with a new revision, deletes as a tombstone and restores as a further revision', async () => {
    const site = await s.sites.create({ name: 'Quarry Lane', region: 'South', timeZone: 'Europe/London' });
    expect(site.rev).toBe(1);
    const renamed = await s.sites.update(site.id, {
      name: 'Quarry Lane 2',
      region: 'South',
      timeZone: 'Europe/London'
    });
    expect(renamed).toMatchObject({ id: site.id, rev: 2, createdAt: site.createdAt, name: 'Quarry Lane 2' });
    const tombstone = await s.sites.remove(site.id);
    expect(tombstone.deletedAt).toBeDefined();
    expect(await s.sites.get(site.id)).toBeUndefined();
    expect(await databaseOf(s).sites.get(site.id)).toMatchObject({ rev: 3, name: 'Quarry Lane 2' });
    const restored = await s.sites.restore(site.id);
    expect(restored.rev).toBe(4);
    expect(restored.deletedAt).toBeUndefined();
  });

  it('refuses bad input with the field named, and writes nothing', async () => {
    await expect(s.sites.create({ name: '', region: '', timeZone: 'Mars/Olympus' })).rejects.toBeInstanceOf(
      ValidationError
    );
    expect(await s.sites.list()).toHaveLength(0);
  });

  it('refuses an edit from a stale revision and an edit of a record that does not exist', async () => {
    const site = await s.sites.create({ name: 'Quarry Lane', region: '', timeZone: 'UTC' });
    await s.sites.update(site.id, { name: 'A', region: '', timeZone: 'UTC' }, 1);
    await expect(
      s.sites.update(site.id, { name: 'B', region: '', timeZone: 'UTC' }, 1)
    ).rejects.toBeInstanceOf(EditConflictError);
    await expect(
      s.sites.update('00000000-0000-4000-8000-000000000000', { name: 'C', region: '', timeZone: 'UTC' })
    ).rejects.toBeInstanceOf(RecordNotFoundError);
    expect((await s.sites.get(site.id))!.name).toBe('A');
  });
});

describe('an edit replaces the known fields whole', () => {
  it('clears an optional field left out (a target removed), and keeps fields a newer version added', async () => {
    const site = await s.sites.create({ name: 'Fenwick', region: '', timeZone: 'UTC' });
    const process = await s.processes.create({
      siteId: site.id,
      name: 'Press',
      owner: '',
      contextId: 'vehicle-parts',
      monthlyVolume: 1,
      costPerDefective: 1,
      currency: 'EUR'
    });
    const ch = await s.characteristics.create({
      processId: process.id,
      name: 'Width',
      unit: 'mm',
      dataKind: 'measured',
      lsl: 9,
      target: 10,
      usl: 11,
      riskClass: 'standard'
    });
    await databaseOf(s).characteristics.put({
      ...(await databaseOf(s).characteristics.get(ch.id))!,
      gauge: 'G-7'
    } as never);
    const edited = await s.characteristics.update(ch.id, {
      processId: process.id,
      name: 'Width',
      unit: 'mm',
      dataKind: 'measured',
      lsl: 9,
      usl: 11,
      riskClass: 'standard'
    });
    expect(edited.target).toBeUndefined();
    expect((edited as unknown as { gauge: string }).gauge).toBe('G-7');
  });
});

describe('listing a large table', () => {
  it('reads every live record, slice by slice, and leaves tombstones out', async () => {
    // Copies of one stored site under other ids, written straight to the table (the repository's checks are
    // not what is tested): more than two slices, every fifth a tombstone.
    const site = await s.sites.create({ name: 'Template', region: '', timeZone: 'UTC' });
    const stored = (await databaseOf(s).sites.get(site.id))!;
    const count = 2 * LIST_SLICE + 7;
    const copies = Array.from({ length: count }, (_, i) => ({
      ...stored,
      id: `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`,
      name: `Site ${i}`,
      ...(i % 5 === 0 ? { deletedAt: stored.updatedAt } : {})
    }));
    await databaseOf(s).sites.bulkPut(copies);
    const live = [stored, ...copies.filter((c) => c.deletedAt === undefined)].map((c) => c.id).sort();
    expect((await s.sites.list()).map((r) => r.id)).toEqual(live);
  });

  it('lists a process’s characteristics through the index, without those of other processes or tombstones', async () => {
    const site = await s.sites.create({ name: 'Fenwick', region: '', timeZone: 'UTC' });
    const fields = { siteId: site.id, owner: '', contextId: 'general-manufacturing' };
    const costs = { monthlyVolume: 1000, costPerDefective: 1, currency: 'EUR' };
    const a = await s.processes.create({ ...fields, ...costs, name: 'A' });
    const b = await s.processes.create({ ...fields, ...costs, name: 'B' });
    const make = (processId: string, name: string) =>
      s.characteristics.create({
        processId,
        name,
        unit: 'mm',
        dataKind: 'measured',
        riskClass: 'standard',
        lsl: 1,
        usl: 2
      });
    const kept = await make(a.id, 'bore');
    const removed = await make(a.id, 'depth');
    await make(b.id, 'width');
    await s.characteristics.remove(removed.id);
    expect((await s.characteristics.listOfProcess(a.id)).map((c) => c.id)).toEqual([kept.id]);
  });
});
