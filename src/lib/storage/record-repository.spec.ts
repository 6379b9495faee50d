import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ValidationError } from '../domain/validation-error';
import { EditConflictError, RecordNotFoundError } from './record-repository';
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
