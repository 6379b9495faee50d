import 'fake-indexeddb/auto';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { canonicalJson } from '../../src/lib/domain/canonical-json';
import type { Process } from '../../src/lib/domain/process';
import { emptyRecords, RECORD_KINDS, type RecordsByKind } from '../../src/lib/domain/record-kinds';
import { contentOf } from '../../src/lib/domain/record-merge';
import {
  stampDeleted,
  stampNew,
  stampRestored,
  stampUpdate,
  versionOf,
  type RecordMeta,
  type WriteContext
} from '../../src/lib/domain/record-meta';
import { mergeRecordSets } from '../../src/lib/domain/record-set-merge';
import { compareVersions } from '../../src/lib/domain/version-vector';
import {
  changeSetOf,
  decodeExchangeFile,
  encodeExchangeFile,
  exchangeText
} from '../../src/lib/exchange/exchange-file';
import { RECORD_TABLES } from '../../src/lib/storage/record-tables';
import { databaseOf, type CapstanStorage } from '../../src/lib/storage/storage';
import { closeDevice, openDevice } from '../support/exchange-harness';

/**
 * Properties of sync (fast-check, 300 random cases each): random histories of edits, deletions and
 * restorations on two devices from a common starting point, with device clocks skewed by up to a day.
 * The database properties run on fake-indexeddb through the same preview/apply path the app uses.
 */
const RUNS = 300;

type SiteRec = RecordMeta & { name: string; region: string; timeZone: string };
type ProcRec = Process;

function device(deviceId: string, skewMs: number): WriteContext & { step: () => void } {
  let t = Date.parse('2026-06-01T00:00:00Z') + skewMs;
  let ids = 0;
  return {
    deviceId,
    now: () => new Date(t),
    newId: () =>
      `${deviceId === 'a' ? 'aaaaaaaa' : deviceId === 'b' ? 'bbbbbbbb' : '00000000'}-0000-4000-8000-${String(++ids).padStart(12, '0')}`,
    step: () => (t += 60_000)
  };
}

/** A common starting point: sites and processes made on device "O". */
function baseRecords(sites: number, processesPerSite: number): RecordsByKind {
  const o = device('o', 0);
  const records = emptyRecords();
  for (let s = 0; s < sites; s++) {
    const site = stampNew({ name: `Plant ${s}`, region: '', timeZone: 'UTC' }, o) as SiteRec;
    records.sites.push(site);
    for (let p = 0; p < processesPerSite; p++) {
      records.processes.push(
        stampNew(
          {
            siteId: site.id,
            name: `Line ${s}.${p}`,
            owner: '',
            contextId: 'general-manufacturing',
            monthlyVolume: 100,
            costPerDefective: 1,
            currency: 'EUR'
          },
          o
        ) as ProcRec
      );
    }
  }
  return records;
}

type Op = { target: number; action: 'rename' | 'delete' | 'restore' | 'create'; text: string };
const opArb = fc.record({
  target: fc.nat({ max: 20 }),
  action: fc.constantFrom('rename', 'rename', 'delete', 'restore', 'create'),
  text: fc.string({ minLength: 1, maxLength: 12 }).filter((s) => s.trim() !== '' && !/[<>]/.test(s))
}) as fc.Arbitrary<Op>;

/**
 * Applies a history to a copy of `base` as one device, under the app's rules: deleting a site deletes its live
 * processes with it (same deletion time), restoring it brings back exactly those, and a process under a
 * deleted site is not edited. Returns the records and which ids it changed.
 */
function play(base: RecordsByKind, ops: Op[], ctx: WriteContext & { step: () => void }) {
  const sites = base.sites.map((r) => ({ ...r })) as SiteRec[];
  const processes = base.processes.map((r) => ({ ...r })) as ProcRec[];
  const changed = new Set<string>();
  const siteOf = (p: ProcRec) => sites.find((x) => x.id === p.siteId);
  for (const op of ops) {
    ctx.step();
    const all: (SiteRec | ProcRec)[] = [...sites, ...processes];
    if (op.action === 'create') {
      const site = stampNew({ name: op.text.trim(), region: '', timeZone: 'UTC' }, ctx) as SiteRec;
      sites.push(site);
      changed.add(site.id);
      continue;
    }
    const i = op.target % all.length;
    const r = all[i]!;
    const isSite = i < sites.length;
    if (!isSite && siteOf(r as ProcRec)?.deletedAt !== undefined) continue;
    let next: SiteRec | ProcRec;
    if (op.action === 'rename') {
      if (r.deletedAt !== undefined) continue;
      const { id: _i, createdAt: _c, updatedAt: _u, rev: _r, deviceId: _d, vv: _v, clock: _k, ...fields } = r;
      next = stampUpdate(r, { ...fields, name: op.text.trim() } as never, ctx);
    } else if (op.action === 'delete') {
      if (r.deletedAt !== undefined) continue;
      next = stampDeleted(r, ctx);
      if (isSite) {
        const at = { ...ctx, now: () => new Date(next.deletedAt!) };
        processes.forEach((p, j) => {
          if (p.siteId !== r.id || p.deletedAt !== undefined) return;
          processes[j] = stampDeleted(p, at);
          changed.add(p.id);
        });
      }
    } else {
      if (r.deletedAt === undefined) continue;
      next = stampRestored(r, ctx);
      if (isSite) {
        processes.forEach((p, j) => {
          if (p.siteId !== r.id || p.deletedAt !== r.deletedAt) return;
          processes[j] = stampRestored(p, ctx);
          changed.add(p.id);
        });
      }
    }
    changed.add(r.id);
    if (isSite) sites[i] = next as SiteRec;
    else processes[i - sites.length] = next as ProcRec;
  }
  const records = emptyRecords();
  records.sites = sites;
  records.processes = processes;
  return { records, changed };
}

/** The settling writer of the pure merge, at a fixed time so that two merge orders can be compared byte for byte. */
const writer: WriteContext = {
  deviceId: 'merge-writer',
  now: () => new Date('2026-07-01T00:00:00Z'),
  newId: () => '00000000-0000-4000-8000-999999999999'
};
const merge = (a: RecordsByKind, b: RecordsByKind, rule?: 'newer') => mergeRecordSets(a, b, rule, writer);

const historyArb = fc.record({
  sites: fc.integer({ min: 1, max: 3 }),
  perSite: fc.integer({ min: 0, max: 2 }),
  a: fc.array(opArb, { maxLength: 6 }),
  b: fc.array(opArb, { maxLength: 6 }),
  skewA: fc.integer({ min: -86_400_000, max: 86_400_000 }),
  skewB: fc.integer({ min: -86_400_000, max: 86_400_000 })
});

interface History {
  sites: number;
  perSite: number;
  a: Op[];
  b: Op[];
  skewA: number;
  skewB: number;
}

function histories(h: History) {
  const base = baseRecords(h.sites, h.perSite);
  return { base, A: play(base, h.a, device('a', h.skewA)), B: play(base, h.b, device('b', h.skewB)) };
}

const text = (r: RecordsByKind) => canonicalJson(r);
const allRecords = (r: RecordsByKind) => RECORD_KINDS.flatMap((k) => r[k] as RecordMeta[]);

/** Ground truth: both devices touched the record and ended with different results (two deletions agree). */
function shouldConflict(id: string, A: ReturnType<typeof play>, B: ReturnType<typeof play>): boolean {
  if (!A.changed.has(id) || !B.changed.has(id)) return false;
  const a = allRecords(A.records).find((r) => r.id === id)!;
  const b = allRecords(B.records).find((r) => r.id === id)!;
  if (a.deletedAt !== undefined && b.deletedAt !== undefined) return false;
  return contentOf(a) !== contentOf(b) || (a.deletedAt === undefined) !== (b.deletedAt === undefined);
}

describe('merge of record sets (properties)', () => {
  it('is idempotent: merging the same set again changes nothing', () => {
    fc.assert(
      fc.property(historyArb, (h) => {
        const { A, B } = histories(h);
        const once = merge(A.records, B.records, 'newer');
        const twice = merge(once.records, B.records, 'newer');
        expect(text(twice.records)).toBe(text(once.records));
        expect(twice.counts.new + twice.counts.updated + twice.counts.deleted + twice.counts.conflict).toBe(
          0
        );
      }),
      { numRuns: RUNS }
    );
  });

  it('commutes: A then B equals B then A when they do not conflict (and with "newer edit wins" when they do)', () => {
    fc.assert(
      fc.property(historyArb, (h) => {
        const { base, A, B } = histories(h);
        const ab = merge(merge(base, A.records).records, B.records, 'newer');
        const ba = merge(merge(base, B.records).records, A.records, 'newer');
        expect(text(ab.records)).toBe(text(ba.records));
        if (ab.conflicts.length === 0) {
          const abPlain = merge(merge(base, A.records).records, B.records);
          const baPlain = merge(merge(base, B.records).records, A.records);
          expect(text(abPlain.records)).toBe(text(baPlain.records));
        }
      }),
      { numRuns: RUNS }
    );
  });

  it('loses no record: every id survives, and each result has seen every write of both sides', () => {
    fc.assert(
      fc.property(historyArb, (h) => {
        const { A, B } = histories(h);
        const merged = merge(A.records, B.records, 'newer');
        const out = new Map(allRecords(merged.records).map((r) => [r.id, r]));
        for (const r of [...allRecords(A.records), ...allRecords(B.records)]) {
          const kept = out.get(r.id);
          expect(kept).toBeDefined();
          expect(['after', 'equal']).toContain(compareVersions(versionOf(kept!), versionOf(r)));
        }
      }),
      { numRuns: RUNS }
    );
  });

  it('reports every record both sides changed differently, alone or inside the family of its deleted parent', () => {
    fc.assert(
      fc.property(historyArb, (h) => {
        const { A, B } = histories(h);
        const merged = merge(A.records, B.records);
        const reported = new Set<string>();
        for (const c of merged.conflicts) {
          reported.add(c.key);
          for (const x of c.absorbed ?? []) reported.add(x.decision.incoming.id);
          // A record conflict (not a family) is raised only where both sides changed the record differently.
          if (c.type === 'record') expect(shouldConflict(c.key, A, B)).toBe(true);
          // A family is raised only where one side deleted the parent.
          if (c.type === 'family')
            expect([c.local, c.incoming].some((v) => v?.deletedAt !== undefined)).toBe(true);
        }
        for (const r of allRecords(B.records))
          if (shouldConflict(r.id, A, B)) expect(reported.has(r.id)).toBe(true);
      }),
      { numRuns: RUNS }
    );
  });
});

describe('sync through the database (properties)', { timeout: 120_000 }, () => {
  let a: CapstanStorage;
  let b: CapstanStorage;
  let c: CapstanStorage;
  beforeAll(async () => {
    [a, b, c] = await Promise.all([openDevice('pa'), openDevice('pb'), openDevice('pc')]);
  });
  afterAll(async () => {
    for (const s of [a, b, c]) await closeDevice(s);
  });

  const header = {
    appVersion: 'test',
    exportedBy: { deviceId: 'property', deviceName: 'property' },
    exportedAt: '2026-12-01T00:00:00.000Z',
    scope: { kind: 'everything' as const }
  };
  async function reset(...devices: CapstanStorage[]) {
    for (const s of devices)
      await databaseOf(s).transaction(
        'rw',
        RECORD_TABLES.map((t) => databaseOf(s).table(t)),
        async () => {
          for (const t of RECORD_TABLES) await databaseOf(s).table(t).clear();
        }
      );
  }
  async function fileOf(records: RecordsByKind) {
    return encodeExchangeFile(changeSetOf(header, records));
  }
  async function importInto(s: CapstanStorage, bytes: Uint8Array, rule?: 'newer') {
    const set = await decodeExchangeFile(bytes);
    const plan = await s.exchange.preview(set.records);
    await s.exchange.apply(plan, rule ? { rule } : {}, { deviceId: 'x', name: 'x', at: header.exportedAt });
    return plan;
  }
  async function dump(s: CapstanStorage) {
    const { records } = await s.exchange.collect({ kind: 'everything' });
    return exchangeText(changeSetOf(header, records));
  }

  it('export, import into an empty database, export again: identical bytes', async () => {
    await fc.assert(
      fc.asyncProperty(historyArb, async (h) => {
        const { A } = histories(h);
        await reset(a, b);
        await importInto(a, await fileOf(A.records));
        const first = await dump(a);
        await importInto(b, new TextEncoder().encode(first));
        expect(await dump(b)).toBe(first);
      }),
      { numRuns: RUNS }
    );
  });

  it('importing a file twice changes nothing the second time', async () => {
    await fc.assert(
      fc.asyncProperty(historyArb, async (h) => {
        const { A, B } = histories(h);
        await reset(a);
        await importInto(a, await fileOf(A.records));
        const fileB = await fileOf(B.records);
        await importInto(a, fileB, 'newer');
        const once = await dump(a);
        const again = await importInto(a, fileB, 'newer');
        expect(again.decisions).toHaveLength(0);
        expect(await dump(a)).toBe(once);
      }),
      { numRuns: RUNS }
    );
  });

  it('A then B and B then A agree once the two devices exchange; without conflicts they match the pure merge', async () => {
    await fc.assert(
      fc.asyncProperty(historyArb, async (h) => {
        const { base, A, B } = histories(h);
        await reset(b, c);
        const [fileBase, fileA, fileB] = await Promise.all([
          fileOf(base),
          fileOf(A.records),
          fileOf(B.records)
        ]);
        let settled = 0;
        for (const [s, first, second] of [
          [b, fileA, fileB],
          [c, fileB, fileA]
        ] as const) {
          await importInto(s, fileBase);
          await importInto(s, first);
          settled += (await importInto(s, second, 'newer')).conflicts.length;
        }
        if (settled === 0) {
          // Nothing to settle: each device merged without writing anything of its own.
          const viaB = await dump(b);
          expect(await dump(c)).toBe(viaB);
          const pure = merge(merge(base, A.records).records, B.records, 'newer');
          expect(viaB).toBe(await exchangeText(changeSetOf(header, pure.records)));
        } else {
          // Each device settled as itself; one exchange each way brings them to the same records.
          await importInto(b, new TextEncoder().encode(await dump(c)), 'newer');
          await importInto(c, new TextEncoder().encode(await dump(b)), 'newer');
          expect(await dump(c)).toBe(await dump(b));
        }
      }),
      { numRuns: RUNS }
    );
  });
});
