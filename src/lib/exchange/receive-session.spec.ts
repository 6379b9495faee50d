import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import {
  canonicalExport,
  exportBytes,
  sealingLine,
  testDevices
} from '../../../tests/support/exchange-harness';
import { editableOf } from '../domain/record-meta';
import { openStorage } from '../storage/storage';
import { decodeExchangeFile } from './exchange-file';
import { receiveChangeSet } from './receive-session';

const device = testDevices();

/** A site device and the office with one characteristic both hold, then both rename it: one conflict. */
async function crossingEdit() {
  const site = await device('site');
  const office = await device('office');
  const { ch } = await sealingLine(site);
  const first = await receiveChangeSet(office, await decodeExchangeFile(await exportBytes(site)));
  await first.merge({}, { deviceId: site.deviceId, name: 'site', at: '2026-12-01T00:00:00Z' });
  await office.characteristics.update(ch.id, { ...editableOf(ch), name: 'Seal force (office)' });
  await site.characteristics.update(ch.id, { ...editableOf(ch), name: 'Seal force (site)' });
  return { site, office, ch };
}

describe('receiving a file as one session: compared, then merged on confirmation', () => {
  it('previews as plain data a worker can post — counts, every conflict key, the shown ones in words — and writes nothing', async () => {
    const { site, office } = await crossingEdit();
    const before = await canonicalExport(office);
    const session = await receiveChangeSet(office, await decodeExchangeFile(await exportBytes(site)));
    const { preview } = session;
    // What crosses from the worker to the page must survive the structured clone unchanged.
    expect(structuredClone(preview)).toEqual(preview);
    expect(preview.counts).toMatchObject({ conflict: 1, new: 0 });
    expect(preview.conflicts).toEqual([{ key: expect.any(String), type: 'record' }]);
    expect(preview.shown).toHaveLength(1);
    expect(preview.shown[0]!.summary.rows.some((r) => r.here === 'Seal force (office)')).toBe(true);
    expect(preview.shown[0]!.summary.rows.some((r) => r.there === 'Seal force (site)')).toBe(true);
    expect(await canonicalExport(office)).toBe(before);
    // An unsettled conflict refuses the merge and writes nothing; the session can still be merged after.
    await expect(
      session.merge({}, { deviceId: site.deviceId, name: 'site', at: '2026-12-02T00:00:00Z' })
    ).rejects.toThrow(/not settled/);
    expect(await canonicalExport(office)).toBe(before);
    const key = preview.conflicts[0]!.key;
    const outcome = await session.merge(
      { perConflict: { [key]: 'incoming' } },
      {
        deviceId: site.deviceId,
        name: 'site',
        at: '2026-12-02T00:00:00Z'
      }
    );
    expect(outcome.counts.conflict).toBe(1);
    expect(outcome.marks.writeMark).toBe(office.syncFolder.writeMark());
    expect(outcome.marks.latestStamp).toBe(office.clock.latest);
  });

  it('is refused once merged or discarded: a file is merged once per reading', async () => {
    const { site, office } = await crossingEdit();
    const bytes = await exportBytes(site);
    const merged = await receiveChangeSet(office, await decodeExchangeFile(bytes));
    await merged.merge(
      { rule: 'incoming' },
      { deviceId: site.deviceId, name: 'site', at: '2026-12-02T00:00:00Z' }
    );
    await expect(
      merged.merge(
        { rule: 'incoming' },
        { deviceId: site.deviceId, name: 'site', at: '2026-12-02T00:00:00Z' }
      )
    ).rejects.toThrow(/read it again/);
    const discarded = await receiveChangeSet(office, await decodeExchangeFile(bytes));
    discarded.close();
    await expect(
      discarded.merge({}, { deviceId: site.deviceId, name: 'site', at: '2026-12-02T00:00:00Z' })
    ).rejects.toThrow(/read it again/);
  });

  it('a merge written by another connection (the worker) moves the page’s clock and write sequence past it', async () => {
    const { site, office } = await crossingEdit();
    // The worker opens the same database on a connection of its own.
    const worker = await openStorage(office.databaseName);
    try {
      const session = await receiveChangeSet(worker, await decodeExchangeFile(await exportBytes(site)));
      const outcome = await session.merge(
        { rule: 'incoming' },
        { deviceId: site.deviceId, name: 'site', at: '2026-12-02T00:00:00Z' }
      );
      expect(outcome.marks.writeMark).toBeGreaterThan(office.syncFolder.writeMark());
      office.exchange.mergedElsewhere(outcome.marks);
      expect(office.syncFolder.writeMark()).toBe(outcome.marks.writeMark);
      expect(office.clock.latest! >= outcome.marks.latestStamp!).toBe(true);
      // The page's next write is sequenced and stamped after everything the worker wrote.
      const siteRow = (await office.sites.list())[0]!;
      await office.sites.update(siteRow.id, { ...editableOf(siteRow), region: 'North' });
      expect(office.syncFolder.writeMark()).toBeGreaterThan(outcome.marks.writeMark);
      expect((await office.sites.get(siteRow.id))!.clock! > outcome.marks.latestStamp!).toBe(true);
    } finally {
      worker.close();
    }
  });
});
