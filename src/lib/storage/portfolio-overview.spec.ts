import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { recordsChangeMark, summariseDatabase } from './portfolio-overview';
import { summariseRecords } from './portfolio-reader';
import { databaseOf, openStorage } from './storage';

describe('the records on this device, counted for the File exchange page', () => {
  it('marks a write of every kind it counts, not a read, and counts the same on a connection of its own', async () => {
    const storage = await openStorage('capstan-records-mark');
    const db = databaseOf(storage);
    const marks = [await recordsChangeMark(db)];
    await storage.sites.list();
    expect(await recordsChangeMark(db)).toBe(marks[0]);
    const site = await storage.sites.create({ name: 'Harbour Works', region: '', timeZone: 'UTC' });
    marks.push(await recordsChangeMark(db));
    const process = await storage.processes.create({
      siteId: site.id,
      name: 'Lid sealing',
      owner: '',
      contextId: 'packaged-goods',
      monthlyVolume: 5000,
      costPerDefective: 2,
      currency: 'EUR'
    });
    marks.push(await recordsChangeMark(db));
    const characteristic = await storage.characteristics.create({
      processId: process.id,
      name: 'Seal strength',
      unit: 'N',
      dataKind: 'measured',
      lsl: 10,
      riskClass: 'standard'
    });
    marks.push(await recordsChangeMark(db));
    const study = await storage.studies.create({
      characteristicId: characteristic.id,
      period: '2026-05',
      data: { kind: 'summary', n: 40, mean: 14, sd: 1.1 },
      enteredBy: ''
    });
    marks.push(await recordsChangeMark(db));
    await storage.studies.remove(study.id, characteristic.id);
    marks.push(await recordsChangeMark(db));
    const { id: _id, ...packaged } = BUILT_IN_PROFILES.find((p) => p.id === 'packaged-goods')!;
    await storage.profiles.save({ ...packaged, contextId: 'packaged-goods' });
    marks.push(await recordsChangeMark(db));
    expect(new Set(marks).size).toBe(marks.length);

    const counted = await summariseRecords(storage.databaseName);
    expect(counted).toEqual(await summariseDatabase(db));
    expect(counted.tables.map((t) => [t.name, t.live, t.tombstones])).toEqual([
      ['Sites', 1, 0],
      ['Processes', 1, 0],
      ['Characteristics', 1, 0],
      ['Studies', 0, 1],
      ['Improvement projects', 0, 0],
      ['Context targets (edited)', 1, 0]
    ]);
    expect(counted.devices).toEqual([expect.objectContaining({ deviceId: storage.deviceId, records: 5 })]);
    storage.close();
    await db.delete();
  });
});
