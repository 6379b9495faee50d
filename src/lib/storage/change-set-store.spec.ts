import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import { editableOf, stampNew, stampUpdate } from '../domain/record-meta';
import { openStorage, databaseOf, type CapstanStorage } from './storage';

/** The change-set store directly: what each scope collects, and what preview and apply refuse. */
const opened: CapstanStorage[] = [];
afterEach(async () => {
  for (const s of opened.splice(0)) {
    databaseOf(s).close();
    await databaseOf(s).delete();
  }
});
async function device() {
  const s = await openStorage(`change-set-${Math.random().toString(36).slice(2)}`);
  opened.push(s);
  return s;
}
async function twoSites(s: CapstanStorage) {
  const out = [];
  for (const name of ['Ostby Works', 'Pell Yard']) {
    const site = await s.sites.create({ name, region: '', timeZone: 'UTC' });
    const process = await s.processes.create({
      siteId: site.id,
      name: `${name} line`,
      owner: '',
      contextId: 'vehicle-parts',
      monthlyVolume: 10,
      costPerDefective: 1,
      currency: 'EUR'
    });
    out.push({ site, process });
  }
  return out;
}

describe('change-set store', () => {
  it('collects everything, one site with its records (and every context profile), or the changes for a peer', async () => {
    const s = await device();
    const [a, b] = await twoSites(s);
    const everything = await s.exchange.collect({ kind: 'everything' });
    expect(everything.records.sites).toHaveLength(2);
    const one = await s.exchange.collect({ kind: 'site', siteId: a!.site.id });
    expect(one.records.sites.map((x) => x.id)).toEqual([a!.site.id]);
    expect(one.records.processes.map((x) => x.id)).toEqual([a!.process.id]);
    // The first file to a peer carries everything; after it is remembered, only later writes (plus a margin).
    const first = await s.exchange.collect({ kind: 'changes', peerId: 'peer-1' });
    expect(first.records.processes).toHaveLength(2);
    expect(b).toBeDefined();
  });

  it('refuses an id that this device holds as another kind of record, writing nothing', async () => {
    const s = await device();
    const [a] = await twoSites(s);
    const ctx = {
      deviceId: 'other',
      now: () => new Date('2026-10-01T00:00:00Z'),
      newId: () => a!.process.id
    };
    const site = stampNew({ name: 'Clash', region: '', timeZone: 'UTC' }, ctx);
    const records = {
      contextProfiles: [],
      sites: [site],
      processes: [],
      characteristics: [],
      studies: [],
      projects: [],
      reviews: []
    };
    await expect(s.exchange.preview(records)).rejects.toThrow(/is a process on this device/);
  });

  it('refuses to apply a preview once a record it writes has changed since, writing nothing', async () => {
    const s = await device();
    const [a] = await twoSites(s);
    const ctx = { deviceId: 'other', now: () => new Date('2026-10-01T00:00:00Z'), newId: () => 'x' };
    const { stampUpdate } = await import('../domain/record-meta');
    const edited = stampUpdate(a!.site, { name: 'Ostby Works (renamed)', region: '', timeZone: 'UTC' }, ctx);
    const records = {
      contextProfiles: [],
      sites: [edited],
      processes: [],
      characteristics: [],
      studies: [],
      projects: [],
      reviews: []
    };
    const plan = await s.exchange.preview(records);
    await s.sites.update(a!.site.id, { name: 'Ostby Works 2', region: '', timeZone: 'UTC' });
    await expect(
      s.exchange.apply(plan, {}, { deviceId: 'other', name: 'o', at: '2026-10-01T00:00:00Z' })
    ).rejects.toThrow(/changed on this device after the preview; nothing was imported/);
    expect((await s.sites.get(a!.site.id))!.name).toBe('Ostby Works 2');
  });
});

/** A device's write context at a fixed time. */
const at = (deviceId: string) => ({
  deviceId,
  now: () => new Date('2026-10-01T00:00:00Z'),
  newId: () => crypto.randomUUID()
});
const office = at('office-device');

/** One site with one process of `count` characteristics, as the office device created them. */
function pressLine(count: number) {
  const site = stampNew({ name: 'Ostby Works', region: '', timeZone: 'UTC' }, office);
  const process = stampNew(
    {
      siteId: site.id,
      name: 'Press line',
      owner: '',
      contextId: 'vehicle-parts',
      monthlyVolume: 10,
      costPerDefective: 1,
      currency: 'EUR'
    },
    office
  );
  const chars = Array.from({ length: count }, (_, i) =>
    stampNew(
      {
        processId: process.id,
        name: `Bore ${i}`,
        unit: 'mm',
        dataKind: 'measured' as const,
        riskClass: 'standard' as const,
        lsl: 9,
        usl: 11
      },
      office
    )
  );
  return { site, process, chars };
}

/** A file of a press line's records and these studies. */
function fileOf<S>(line: ReturnType<typeof pressLine>, studies: S[]) {
  return {
    contextProfiles: [],
    sites: [line.site],
    processes: [line.process],
    characteristics: line.chars,
    studies,
    projects: [],
    reviews: []
  };
}

/** One study of September 2026 under each characteristic, as the office device logged them. */
function septemberOf(chars: readonly { id: string }[]) {
  return chars.map((c) =>
    stampNew(
      {
        characteristicId: c.id,
        period: '2026-09',
        enteredBy: 'office-device',
        data: { kind: 'summary' as const, n: 30, mean: 10, sd: 0.2 }
      },
      office
    )
  );
}

describe('a file of many months', () => {
  // 4 400 months in one file, every one of them shared with this device: the file logging all the studies held
  // here (a device's file received again), or fewer of them (the device also holds 40 earlier months).
  it.each([
    ['every study held here', 0],
    ['half of the studies held here', 40]
  ])(
    'finds every month it shares with this device, however many the file logs (%s)',
    async (_way, earlier) => {
      const characteristics = 110;
      const months = 40;
      const { site, process, chars } = pressLine(characteristics);
      const studiesBy = (ctx: ReturnType<typeof at>, first = 0, count = months) =>
        chars.flatMap((c) =>
          Array.from({ length: count }, (_, k) => first + k).map((m) =>
            stampNew(
              {
                characteristicId: c.id,
                period: `${2020 + Math.floor(m / 12)}-${String((m % 12) + 1).padStart(2, '0')}`,
                enteredBy: ctx.deviceId,
                data: { kind: 'summary' as const, n: 30, mean: 10, sd: 0.2 }
              },
              ctx
            )
          )
        );
      const records = (studies: ReturnType<typeof studiesBy>) => fileOf({ site, process, chars }, studies);
      const s = await device();
      const source = { deviceId: 'office-device', name: 'office', at: '2026-10-01T00:00:00Z' };
      const held = studiesBy(office, 0, earlier + months);
      await s.exchange.apply(await s.exchange.preview(records(held)), {}, source);
      // The same months logged on another device: every one of them is a month with two studies.
      const plan = await s.exchange.preview(records(studiesBy(at('lead-device'), earlier)));
      const clashes = plan.conflicts.filter((c) => c.type === 'same-month');
      expect(clashes).toHaveLength(characteristics * months);
      // And the file of this device's own studies is all unchanged.
      const again = await s.exchange.preview(records(held.slice(0, characteristics * months)));
      expect(again.counts).toMatchObject({ new: 0, updated: 0, conflict: 0 });
    },
    120_000
  );

  it('finds the parents of every study of a file naming more of them than one read asks for', async () => {
    // 2 500 characteristics held here, a file of one study under each: their parents are read a part at a time
    // (KEYS_PER_GET), and one of the last, deleted here, must still be seen for the conflict its study makes.
    const { site, process, chars } = pressLine(2500);
    const none = { contextProfiles: [], projects: [], reviews: [] };
    const s = await device();
    const source = { deviceId: 'office-device', name: 'office', at: '2026-10-01T00:00:00Z' };
    const setup = { ...none, sites: [site], processes: [process], characteristics: chars, studies: [] };
    await s.exchange.apply(await s.exchange.preview(setup), {}, source);
    // One of the last characteristics was deleted here: a study logged under it there is a conflict, which the
    // preview sees only if it read that parent.
    const gone = chars[2400]!;
    await s.characteristics.remove(gone.id);
    const studies = septemberOf(chars);
    const plan = await s.exchange.preview({
      ...none,
      sites: [],
      processes: [],
      characteristics: [],
      studies
    });
    expect(plan.conflicts.map((c) => [c.key, c.nature])).toEqual([[gone.id, 'deleted-here']]);
  }, 60_000);
});

describe('a long merge', () => {
  it('reports the records written as it goes, up to all of them', async () => {
    const line = pressLine(600);
    const s = await device();
    const file = fileOf(line, septemberOf(line.chars));
    const heard: [number, number][] = [];
    const result = await s.exchange.apply(
      await s.exchange.preview(file),
      {},
      { deviceId: 'office-device', name: 'office', at: '2026-10-01T00:00:00Z' },
      (written, total) => heard.push([written, total])
    );
    // A part per table and WRITE_SLICE records: the site, the process, three parts of characteristics, three of
    // studies; every report counts more than the one before, and the last counts every record written.
    expect(result.written).toBe(1202);
    expect(heard).toHaveLength(8);
    expect(heard.every(([w], i) => i === 0 || w > heard[i - 1]![0])).toBe(true);
    expect(heard.every(([, total]) => total === 1202)).toBe(true);
    expect(heard.at(-1)).toEqual([1202, 1202]);
  }, 60_000);

  it('writes nothing when a part fails after earlier parts were handed over', async () => {
    // Two parts are in flight at a time: the failure of the last part (the 550th of 600 studies) must still undo
    // every part before it, and the characteristics written before the studies.
    const line = pressLine(600);
    const s = await device();
    const plan = await s.exchange.preview(fileOf(line, septemberOf(line.chars)));
    const db = databaseOf(s);
    let created = 0;
    db.studyShelves.hook('creating', () => {
      created += 1;
      if (created === 550) throw new Error('the disk is full');
    });
    await expect(
      s.exchange.apply(plan, {}, { deviceId: 'office-device', name: 'office', at: '2026-10-01T00:00:00Z' })
    ).rejects.toThrow();
    expect(created).toBeGreaterThanOrEqual(550);
    for (const table of [db.sites, db.processes, db.characteristics, db.studyShelves])
      expect(await table.count()).toBe(0);
  }, 60_000);

  it('checks each record it updates in a large table against the preview before writing, a part or all', async () => {
    // 100 of 600 characteristics renamed on another device: fewer writes than the table holds, each compared
    // with this device's version as the preview saw it (a record missed there would refuse the merge).
    const { site, process, chars } = pressLine(600);
    const none = { contextProfiles: [], studies: [], projects: [], reviews: [] };
    const s = await device();
    const source = { deviceId: 'office-device', name: 'office', at: '2026-10-01T00:00:00Z' };
    const setup = { ...none, sites: [site], processes: [process], characteristics: chars };
    await s.exchange.apply(await s.exchange.preview(setup), {}, source);
    const lead = { ...at('lead-device'), now: () => new Date('2026-10-02T00:00:00Z') };
    const renamed = chars
      .slice(0, 100)
      .map((c) => stampUpdate(c, { ...editableOf(c), name: `${c.name} (renamed)` }, lead));
    const file = { ...none, sites: [], processes: [], characteristics: renamed };
    const result = await s.exchange.apply(await s.exchange.preview(file), {}, source);
    expect(result.counts).toMatchObject({ updated: 100, conflict: 0 });
    const held = await databaseOf(s).characteristics.get(renamed[99]!.id);
    expect(held?.name).toBe('Bore 99 (renamed)');
    // Then every one of them, as many writes as the table holds.
    const later = { ...at('lead-device'), now: () => new Date('2026-10-03T00:00:00Z') };
    const stored = await databaseOf(s).characteristics.toArray();
    const all = stored.map((c) => stampUpdate(c, { ...editableOf(c), unit: 'in' }, later));
    const again = await s.exchange.apply(
      await s.exchange.preview({ ...none, sites: [], processes: [], characteristics: all }),
      {},
      source
    );
    expect(again.counts).toMatchObject({ updated: 600, conflict: 0 });
  }, 60_000);
});
