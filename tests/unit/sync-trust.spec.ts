import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import { canonicalJson } from '../../src/lib/domain/canonical-json';
import { parseStamp } from '../../src/lib/domain/hybrid-clock';
import { mergeRecord, settleConflict } from '../../src/lib/domain/record-merge';
import { stampNew, stampUpdate, type RecordMeta } from '../../src/lib/domain/record-meta';
import {
  changeSetOf,
  decodeExchangeFile,
  encodeExchangeFile,
  exchangeText
} from '../../src/lib/exchange/exchange-file';
import { databaseOf, type CapstanStorage } from '../../src/lib/storage/storage';
import { closeDevice, exportBytes, receiveBytes, openDevice } from '../support/exchange-harness';

/**
 * The sync paths of the trust issue, each at the level where it went wrong: a far-future stamp, a device named
 * after an object member, a delete against an edit of a parent with records under it, fields from a newer
 * version, and one month logged on two devices.
 */
const opened: CapstanStorage[] = [];
afterEach(async () => {
  for (const s of opened.splice(0)) await closeDevice(s);
});
async function device(label: string) {
  const s = await openDevice(label);
  opened.push(s);
  return s;
}

async function plant(s: CapstanStorage) {
  const site = await s.sites.create({ name: 'Tessel Works', region: 'North', timeZone: 'Europe/Oslo' });
  const process = await s.processes.create({
    siteId: site.id,
    name: 'Extrusion',
    owner: 'K. Aas',
    contextId: 'vehicle-parts',
    monthlyVolume: 5000,
    costPerDefective: 4,
    currency: 'NOK'
  });
  const ch = await s.characteristics.create({
    processId: process.id,
    name: 'Wall thickness',
    unit: 'mm',
    dataKind: 'measured',
    lsl: 1.9,
    usl: 2.1,
    riskClass: 'key'
  });
  return { site, process, ch };
}

describe('stamps from the far future', () => {
  it('a file carrying the largest stamp is refused, naming the record and the device; nothing changes', async () => {
    const a = await device('a');
    const { site } = await plant(a);
    const file = await decodeExchangeFile(await exportBytes(a));
    const poisoned = file.records.sites.map((r) =>
      r.id === site.id ? { ...r, clock: `9999999999999-9999-${a.deviceId}` } : r
    );
    const bytes = await encodeExchangeFile(changeSetOf(file.header, { ...file.records, sites: poisoned }));
    await expect(decodeExchangeFile(bytes)).rejects.toThrow(
      new RegExp(
        `records\\.sites\\[0\\] \\(site ${site.id}\\), clock: written by device ${a.deviceId} with a clock stamp \\d+ years ahead`
      )
    );
  });

  it('a device that already holds such a stamp stamps its next edit at its own time and can always export', async () => {
    const a = await device('a');
    const { site } = await plant(a);
    // As an older version would have stored it, before such stamps were refused.
    await databaseOf(a).sites.put({
      ...(await databaseOf(a).sites.get(site.id))!,
      clock: `9999999999999-9999-${a.deviceId}`
    });
    const edited = await a.sites.update(site.id, {
      name: 'Tessel Works 2',
      region: 'North',
      timeZone: 'Europe/Oslo'
    });
    const wall = parseStamp(edited.clock!)!.wallMs;
    expect(Math.abs(wall - Date.now())).toBeLessThan(60_000);
    expect(edited.clock).toMatch(/^\d{13}-\d{4}-/);
    const b = await device('b');
    const { changeSet } = await receiveBytes(b, await exportBytes(a));
    expect(changeSet.records.sites).toHaveLength(1);
  });
});

describe('device ids named after object members', () => {
  it('a vector naming toString is refused at the door; in memory it never yields NaN', async () => {
    const a = await device('a');
    await plant(a);
    const file = await decodeExchangeFile(await exportBytes(a));
    const bad = file.records.sites.map((r) => ({ ...r, vv: { ...r.vv, toString: 1 }, rev: r.rev + 1 }));
    const bytes = await encodeExchangeFile(
      changeSetOf(file.header, { ...file.records, sites: bad as never })
    );
    await expect(decodeExchangeFile(bytes)).rejects.toThrow(/vv\.toString: .*a device id is 1–80 lower-case/);
    // The merge itself reads vectors as own properties only: a vector without "toString" counts it as 0.
    const ctx = (deviceId: string) => ({
      deviceId,
      now: () => new Date('2026-10-01T00:00:00Z'),
      newId: () => 'x'
    });
    const base = stampNew({ name: 'n' }, ctx('a')) as RecordMeta & { name: string };
    const here = stampUpdate(base, { name: 'here' }, ctx('b'));
    const edited = stampUpdate(base, { name: 'there' }, ctx('c'));
    // A vector as an unchecked file could carry it (the reader refuses it; the arithmetic must not break anyway).
    const there = { ...edited, vv: { ...edited.vv, toString: 1 }, rev: edited.rev + 1 };
    const settled = settleConflict(mergeRecord(here, there), 'newer');
    expect(Number.isFinite(settled.rev)).toBe(true);
    expect(settled.rev).toBe(4);
  });
});

describe('a site deleted on one device and renamed on another', () => {
  it('is one conflict that counts the records under it, and either outcome keeps the family whole', async () => {
    for (const keep of [true, false]) {
      const office = await device('office');
      const lead = await device('lead');
      const { site, ch } = await plant(office);
      await office.studies.logOne(
        {
          characteristicId: ch.id,
          period: '2026-09',
          data: { kind: 'summary', n: 30, mean: 2.0, sd: 0.02 },
          enteredBy: 'K'
        },
        'new'
      );
      await receiveBytes(lead, await exportBytes(office));
      await office.sites.removeWithContents(site.id);
      await lead.sites.update(site.id, {
        name: 'Tessel Works (renamed)',
        region: 'North',
        timeZone: 'Europe/Oslo'
      });
      const file = await decodeExchangeFile(await exportBytes(office));
      const plan = await lead.exchange.preview(file.records);
      expect(plan.conflicts).toHaveLength(1);
      const c = plan.conflicts[0]!;
      expect(c).toMatchObject({ type: 'family', nature: 'deleted-there', kind: 'sites' });
      expect(c.deletedWith).toEqual({ processes: 1, characteristics: 1, studies: 1 });
      await lead.exchange.apply(
        plan,
        { perConflict: { [c.key]: keep ? 'local' : 'incoming' } },
        {
          deviceId: office.deviceId,
          name: 'office',
          at: new Date().toISOString()
        }
      );
      expect((await lead.sites.list()).length).toBe(keep ? 1 : 0);
      expect((await lead.processes.list()).length).toBe(keep ? 1 : 0);
      expect((await lead.characteristics.list()).length).toBe(keep ? 1 : 0);
      expect((await lead.studies.forCharacteristic(ch.id)).length).toBe(keep ? 1 : 0);
      if (keep) expect((await lead.sites.list())[0]!.name).toBe('Tessel Works (renamed)');
      // Sent back, the outcome reaches the office whole, with no further question.
      const back = await receiveBytes(office, await exportBytes(lead));
      expect(back.plan.conflicts).toHaveLength(0);
      expect((await office.characteristics.list()).length).toBe(keep ? 1 : 0);
      expect((await office.studies.forCharacteristic(ch.id)).length).toBe(keep ? 1 : 0);
    }
  });
});

describe('fields from a newer version', () => {
  it('are kept and passed on unchanged', async () => {
    const a = await device('a');
    const b = await device('b');
    const c = await device('c');
    await plant(a);
    const file = await decodeExchangeFile(await exportBytes(a));
    const newer = file.records.characteristics.map((r) => ({
      ...r,
      drawingRef: 'DWG-2207 rev C',
      gauge: { id: 'G-14' }
    }));
    const text = await exchangeText(
      changeSetOf(file.header, { ...file.records, characteristics: newer as never })
    );
    await receiveBytes(b, new TextEncoder().encode(text));
    // Edited here by a version that does not know the fields: they stay.
    const ch = (await b.characteristics.list())[0]!;
    const {
      id: _i,
      createdAt: _c,
      updatedAt: _u,
      rev: _r,
      deviceId: _d,
      vv: _v,
      clock: _k,
      localSeq: _l,
      ...fields
    } = ch as typeof ch & { localSeq?: number };
    void [_i, _c, _u, _r, _d, _v, _k, _l];
    await b.characteristics.update(ch.id, { ...fields, usl: 2.12 });
    await receiveBytes(c, await exportBytes(b));
    const passed = (await c.characteristics.list())[0] as unknown as Record<string, unknown>;
    expect(passed.drawingRef).toBe('DWG-2207 rev C');
    expect(canonicalJson(passed.gauge)).toBe('{"id":"G-14"}');
    expect(passed.usl).toBe(2.12);
  });
});

describe('one month logged on two devices', () => {
  it('is a conflict shown with both studies readable; combining pools them and both devices agree', async () => {
    const office = await device('office');
    const lead = await device('lead');
    const { ch } = await plant(office);
    await receiveBytes(lead, await exportBytes(office));
    await office.studies.logOne(
      {
        characteristicId: ch.id,
        period: '2026-09',
        data: { kind: 'summary', n: 30, mean: 2.0, sd: 0.02 },
        enteredBy: 'Office'
      },
      'new'
    );
    await lead.studies.logOne(
      {
        characteristicId: ch.id,
        period: '2026-09',
        data: { kind: 'summary', n: 20, mean: 2.01, sd: 0.03 },
        enteredBy: 'Lead'
      },
      'new'
    );
    const file = await decodeExchangeFile(await exportBytes(lead));
    const plan = await office.exchange.preview(file.records);
    expect(plan.conflicts).toHaveLength(1);
    expect(plan.conflicts[0]).toMatchObject({ type: 'same-month', canCombine: true });
    const { summariseConflict } = await import('../../src/lib/domain/conflict-summary');
    const lookup = (id: string) => plan.snapshot.record(id) ?? plan.incoming.get(id)?.record;
    const s = summariseConflict(plan.conflicts[0]!, lookup);
    expect(s.title).toBe('Study of 2026-09, Wall thickness — Extrusion — Tessel Works');
    expect(s.rows.find((r) => r.label === 'n')).toEqual({ label: 'n', here: '30', there: '20' });
    expect(s.rows.find((r) => r.label === 'entered by')).toEqual({
      label: 'entered by',
      here: 'Office',
      there: 'Lead'
    });
    await office.exchange.apply(
      plan,
      { perConflict: { [plan.conflicts[0]!.key]: 'combine' } },
      {
        deviceId: lead.deviceId,
        name: 'lead',
        at: new Date().toISOString()
      }
    );
    const kept = await office.studies.forCharacteristic(ch.id);
    expect(kept).toHaveLength(1);
    expect(kept[0]!.data).toMatchObject({ kind: 'summary', n: 50 });
    await receiveBytes(lead, await exportBytes(office));
    const travel = (x: RecordMeta) => canonicalJson({ ...x, localSeq: undefined });
    expect((await lead.studies.forCharacteristic(ch.id)).map(travel)).toEqual(kept.map(travel));
  });
});
