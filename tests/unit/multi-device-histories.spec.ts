import 'fake-indexeddb/auto';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { ConflictChoice, MergeChoices } from '../../src/lib/domain/change-set-merge';
import { parentIdOf, RECORD_KINDS, type RecordKind } from '../../src/lib/domain/record-kinds';
import type { RecordMeta } from '../../src/lib/domain/record-meta';
import type { Site } from '../../src/lib/domain/site';
import type { Study, StudyData } from '../../src/lib/domain/study';
import { liveMonthClashes } from '../../src/lib/domain/study-month';
import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { prepareExport } from '../../src/lib/exchange/export-change-set';
import type { SiteRemoval } from '../../src/lib/storage/site-repository';
import { databaseOf, type CapstanStorage } from '../../src/lib/storage/storage';
import { shelfProblems } from '../../src/lib/storage/study-shelf';
import { canonicalExport, closeDevice, openDevice } from '../support/exchange-harness';

/**
 * The invariants of sync, over random multi-device histories run through the app's own repositories and its
 * file exchange (fake-indexeddb; fast-check decides every step). Three devices — an office, a site lead and a
 * second site lead whose clock runs up to 20 hours fast — start from the office's portfolio, then log months
 * (the same month on two devices is common: three months, few characteristics), replace and combine, rename,
 * delete and restore sites (with everything under them), add processes, delete studies, and exchange files in
 * random order and scope, settling every conflict by a random choice or rule. Now and then a device whose
 * clock is three days fast sends a file, which must be refused with nothing changed. After the history every
 * device sends everything to every other until nothing changes ("newer edit wins"), and then:
 *
 * 1. all devices hold the same records (converge);
 * 2. no characteristic has more than one live study per month;
 * 3. no live record sits under a deleted or missing parent;
 * 4. no number anywhere is NaN or Infinity;
 * 5. every device's export passes the reader's checks (what `check` runs);
 * 6. nothing entered is lost unless it was deleted on purpose or a conflict about it (or a parent) was shown;
 * 7. every study is stored once, on the shelf of its characteristic, which counts it and carries its write
 *    sequence (storage/study-shelf.ts shelfProblems).
 */
const HISTORIES = Number(process.env.CAPSTAN_HISTORIES ?? 500);
const MONTHS = ['2026-08', '2026-09', '2026-10'];
const T0 = Date.parse('2026-11-15T08:00:00Z');
const HOUR = 3_600_000;

type Op =
  | { op: 'log'; device: number; ch: number; month: number; data: number; mode: 'replace' | 'combine' }
  | { op: 'rename'; device: number; target: number }
  | { op: 'removeSite'; device: number; target: number }
  | { op: 'undoRemove'; device: number }
  | { op: 'addProcess'; device: number; target: number }
  | { op: 'deleteStudy'; device: number; ch: number; month: number }
  | { op: 'send'; from: number; to: number; everything: boolean; settle: number }
  | { op: 'fastFile'; to: number };

const device = fc.integer({ min: 0, max: 2 });
const opArb: fc.Arbitrary<Op> = fc.oneof(
  {
    weight: 5,
    arbitrary: fc.record({
      op: fc.constant('log' as const),
      device,
      ch: fc.nat(3),
      month: fc.nat(2),
      data: fc.nat(1000),
      mode: fc.constantFrom('replace' as const, 'combine' as const)
    })
  },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('rename' as const), device, target: fc.nat(5) }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('removeSite' as const), device, target: fc.nat(1) }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('undoRemove' as const), device }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('addProcess' as const), device, target: fc.nat(1) }) },
  {
    weight: 1,
    arbitrary: fc.record({ op: fc.constant('deleteStudy' as const), device, ch: fc.nat(3), month: fc.nat(2) })
  },
  {
    weight: 4,
    arbitrary: fc.record({
      op: fc.constant('send' as const),
      from: device,
      to: device,
      everything: fc.boolean(),
      settle: fc.nat(1000)
    })
  },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('fastFile' as const), to: device }) }
);

const SKEW = [0, -2 * HOUR, 20 * HOUR];

let devices: CapstanStorage[] = [];
let fast: CapstanStorage;

beforeAll(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
});
afterAll(async () => {
  vi.useRealTimers();
});

function dataFor(seed: number, counted: boolean): StudyData {
  if (counted) return { kind: 'defectives', units: 100 + (seed % 900), defectives: seed % 7 };
  if (seed % 3 === 0)
    return { kind: 'raw', values: Array.from({ length: 8 }, (_, i) => 10 + ((seed + i * 37) % 50) / 100) };
  return { kind: 'summary', n: 5 + (seed % 40), mean: 10 + (seed % 100) / 200, sd: 0.1 + (seed % 30) / 100 };
}

function allNumbersFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (value === null || typeof value !== 'object') return true;
  return Object.values(value).every(allNumbersFinite);
}

async function allRecords(s: CapstanStorage): Promise<Map<string, { kind: RecordKind; record: RecordMeta }>> {
  const { records } = await s.exchange.collect({ kind: 'everything' });
  const out = new Map<string, { kind: RecordKind; record: RecordMeta }>();
  for (const kind of RECORD_KINDS)
    for (const r of records[kind] as RecordMeta[]) out.set(r.id, { kind, record: r });
  return out;
}

describe('random multi-device histories', { timeout: 900_000 }, () => {
  it(`keep every invariant over ${HISTORIES} histories`, async () => {
    let clock = T0;
    const at = (d: number) => vi.setSystemTime(clock + SKEW[d]!);
    await fc.assert(
      fc.asyncProperty(fc.array(opArb, { minLength: 4, maxLength: 16 }), async (generated) => {
        // CAPSTAN_HISTORY replays one history (a counterexample printed by a failing run).
        const ops: Op[] = process.env.CAPSTAN_HISTORY
          ? (JSON.parse(process.env.CAPSTAN_HISTORY) as Op[])
          : generated;
        for (const s of devices) await closeDevice(s);
        clock = T0;
        vi.setSystemTime(clock);
        devices = await Promise.all([openDevice('office'), openDevice('lead'), openDevice('lead-2')]);
        fast = await openDevice('fast');
        const [office] = devices as [CapstanStorage];
        // The office's portfolio: two sites, two processes, four characteristics (one counted).
        const sites: Site[] = [];
        const chars: { id: string; counted: boolean }[] = [];
        for (let i = 0; i < 2; i++) {
          const site = await office.sites.create({ name: `Plant ${i}`, region: '', timeZone: 'UTC' });
          sites.push(site);
          const p = await office.processes.create({
            siteId: site.id,
            name: `Line ${i}`,
            owner: '',
            contextId: 'vehicle-parts',
            monthlyVolume: 1000,
            costPerDefective: 3,
            currency: 'EUR'
          });
          for (const counted of [false, true]) {
            const c = await office.characteristics.create({
              processId: p.id,
              name: `${counted ? 'Leaks' : 'Bore'} ${i}`,
              unit: counted ? '' : 'mm',
              dataKind: counted ? 'counted' : 'measured',
              ...(counted ? {} : { lsl: 9, usl: 11 }),
              riskClass: 'standard'
            });
            chars.push({ id: c.id, counted });
          }
        }
        const start = await prepareExport(office, { kind: 'everything' }, ident(0));
        for (const s of devices.slice(1)) await importAll(s, start.bytes, { rule: 'newer' }, new Set());

        const deletedOnPurpose = new Set<string>();
        const shown = new Set<string>();
        const entered = new Map<string, number>(); // study id → device that logged it
        const removals: (SiteRemoval | undefined)[] = [undefined, undefined, undefined];
        for (const op of ops) {
          clock += 5 * 60_000;
          if (op.op === 'send') {
            if (op.from === op.to) continue;
            at(op.from);
            const from = devices[op.from]!;
            const to = devices[op.to]!;
            const file = await prepareExport(
              from,
              op.everything ? { kind: 'everything' } : { kind: 'changes', peerId: to.deviceId },
              ident(op.from),
              { peerName: `device ${op.to}` }
            );
            at(op.to);
            await importAll(to, file.bytes, settleRandomly(op.settle), shown);
            continue;
          }
          if (op.op === 'fastFile') {
            // A device whose clock runs three days fast: its file is refused, and nothing changes.
            vi.setSystemTime(clock + 72 * HOUR);
            await fast.sites.create({ name: 'From the future', region: '', timeZone: 'UTC' });
            const file = await prepareExport(fast, { kind: 'everything' }, ident(0));
            at(op.to);
            const before = await canonicalExport(devices[op.to]!);
            await expect(decodeExchangeFile(file.bytes)).rejects.toThrow(/ahead of this device's clock/);
            expect(await canonicalExport(devices[op.to]!)).toBe(before);
            continue;
          }
          const s = devices[op.device]!;
          at(op.device);
          try {
            if (op.op === 'log') {
              const c = chars[op.ch]!;
              const outcome = await s.studies.logOne(
                {
                  characteristicId: c.id,
                  period: MONTHS[op.month]!,
                  data: dataFor(op.data, c.counted),
                  enteredBy: `d${op.device}`
                },
                op.mode
              );
              entered.set(outcome.study.id, op.device);
            } else if (op.op === 'rename') {
              const live = (await s.sites.list()).concat();
              const procs = await s.processes.list();
              const all = [...live, ...procs];
              const r = all[op.target % Math.max(1, all.length)];
              if (!r) continue;
              if ('timeZone' in r)
                await s.sites.update(r.id, { name: `${r.name}'`, region: r.region, timeZone: r.timeZone });
              else
                await s.processes.update(r.id, {
                  siteId: r.siteId,
                  name: `${r.name}'`,
                  owner: r.owner,
                  contextId: r.contextId,
                  monthlyVolume: r.monthlyVolume,
                  costPerDefective: r.costPerDefective,
                  currency: r.currency
                });
            } else if (op.op === 'removeSite') {
              const site = sites[op.target]!;
              if (!(await s.sites.get(site.id))) continue;
              removals[op.device] = await s.sites.removeWithContents(site.id);
              deletedOnPurpose.add(site.id);
            } else if (op.op === 'undoRemove') {
              const removal = removals[op.device];
              if (!removal) continue;
              removals[op.device] = undefined;
              await s.sites.undoRemoval(removal);
            } else if (op.op === 'addProcess') {
              const site = sites[op.target]!;
              if (!(await s.sites.get(site.id))) continue;
              await s.processes.create({
                siteId: site.id,
                name: `New line ${op.device}`,
                owner: '',
                contextId: 'vehicle-parts',
                monthlyVolume: 10,
                costPerDefective: 1,
                currency: 'EUR'
              });
            } else if (op.op === 'deleteStudy') {
              const study = await s.studies.findForMonth(chars[op.ch]!.id, MONTHS[op.month]!);
              if (!study) continue;
              await s.studies.remove(study.id, study.characteristicId);
              deletedOnPurpose.add(study.id);
            }
          } catch (error) {
            // A refusal the app would show (a deleted characteristic, a stale edit) — nothing to check here.
            if (
              !(error instanceof Error) ||
              !/does not exist|was changed elsewhere|deleted/.test(error.message)
            )
              throw error;
          }
        }

        // Everyone sends everything to everyone until a round changes nothing.
        for (let round = 0; round < 6; round++) {
          let written = 0;
          for (let a = 0; a < 3; a++)
            for (let b = 0; b < 3; b++) {
              if (a === b) continue;
              clock += 60_000;
              at(a);
              const file = await prepareExport(devices[a]!, { kind: 'everything' }, ident(a));
              at(b);
              written += await importAll(devices[b]!, file.bytes, { rule: 'newer' }, shown);
            }
          if (written === 0) break;
        }

        // 1. Convergence.
        const exports = await Promise.all(devices.map((s) => canonicalExport(s)));
        expect(exports[1]).toBe(exports[0]);
        expect(exports[2]).toBe(exports[0]);
        const records = await allRecords(devices[0]!);
        const live = (id: string | undefined) => {
          const r = id === undefined ? undefined : records.get(id);
          return r !== undefined && r.record.deletedAt === undefined;
        };
        // 2. One live study per characteristic and month.
        const studies = [...records.values()]
          .filter((r) => r.kind === 'studies')
          .map((r) => r.record as Study);
        expect(liveMonthClashes(studies)).toEqual([]);
        for (const { kind, record } of records.values()) {
          // 3. No live record under a deleted or missing parent.
          const parent = parentIdOf(kind, record);
          if (record.deletedAt === undefined && parent !== undefined) expect(live(parent)).toBe(true);
          // 4. No NaN or Infinity.
          expect(allNumbersFinite(record)).toBe(true);
        }
        // 5. Every export passes the reader's checks.
        for (let d = 0; d < 3; d++) {
          at(d);
          const file = await prepareExport(devices[d]!, { kind: 'everything' }, ident(d));
          await expect(decodeExchangeFile(file.bytes)).resolves.toBeDefined();
        }
        // 7. Every study stored once, on its characteristic's shelf.
        for (const s of devices)
          expect(shelfProblems(await databaseOf(s).studyShelves.toArray())).toEqual([]);
        // 6. Nothing entered is lost without a deliberate delete or a conflict shown about it or a parent.
        for (const id of entered.keys()) {
          if (live(id)) continue;
          const lineage: string[] = [id];
          let kind: RecordKind = 'studies';
          let r = records.get(id)?.record;
          while (r) {
            const p = parentIdOf(kind, r);
            if (p === undefined) break;
            lineage.push(p);
            const next = records.get(p);
            kind = next?.kind ?? kind;
            r = next?.record;
          }
          const explained = lineage.some((x) => deletedOnPurpose.has(x) || shown.has(x));
          expect(explained, `study ${id} was lost without a conflict being shown`).toBe(true);
        }
      }),
      // A fixed seed keeps the test command's 500 histories the same from run to run (CAPSTAN_SEED explores others;
      // a failure prints the seed and the shrunk history to replay with CAPSTAN_HISTORY).
      { numRuns: HISTORIES, seed: Number(process.env.CAPSTAN_SEED ?? 20261202) }
    );
    for (const s of [...devices, fast]) await closeDevice(s);
    devices = [];
  });
});

function ident(d: number) {
  return { appVersion: 'test', deviceName: `device ${d}`, exportedAt: new Date().toISOString() };
}

/** Settles conflicts as a person might: each by a choice of its own, or all by one rule (from the seed). */
function settleRandomly(
  seed: number
): (c: { key: string; type: string; canCombine?: boolean }[]) => MergeChoices {
  return (conflicts) => {
    if (seed % 4 === 0) return { rule: (['newer', 'local', 'incoming'] as const)[seed % 3]! };
    const perConflict: Record<string, ConflictChoice> = {};
    conflicts.forEach((c, i) => {
      const options: ConflictChoice[] =
        c.type === 'same-month' && c.canCombine ? ['local', 'incoming', 'combine'] : ['local', 'incoming'];
      perConflict[c.key] = options[(seed + i * 7) % options.length]!;
    });
    return { perConflict };
  };
}

/** Reads, previews and applies a file; every conflict shown is remembered; returns the records written. */
async function importAll(
  s: CapstanStorage,
  bytes: Uint8Array,
  settle: MergeChoices | ((c: { key: string; type: string; canCombine?: boolean }[]) => MergeChoices),
  shown: Set<string>
): Promise<number> {
  const set = await decodeExchangeFile(bytes);
  const plan = await s.exchange.preview(set.records);
  for (const c of plan.conflicts) {
    shown.add(c.key);
    if (c.local) shown.add(c.local.id);
    if (c.incoming) shown.add(c.incoming.id);
    for (const a of c.absorbed ?? []) shown.add(a.decision.incoming.id);
  }
  const choices = typeof settle === 'function' ? settle(plan.conflicts) : settle;
  if (process.env.CAPSTAN_HISTORY)
    console.log(
      'import into',
      s.deviceId.slice(0, 4),
      'from',
      set.header.exportedBy.deviceName,
      plan.conflicts.map((c) => [
        c.type,
        c.nature,
        c.kind,
        c.local?.id.slice(0, 8),
        c.incoming?.id.slice(0, 8)
      ]),
      set.records.studies
        .map((x) => `${x.id.slice(0, 8)} ${x.period} ${x.deletedAt ? 'dead' : 'live'}`)
        .join(' | '),
      JSON.stringify(choices)
    );
  const result = await s.exchange.apply(plan, choices, {
    deviceId: set.header.exportedBy.deviceId,
    name: set.header.exportedBy.deviceName,
    at: new Date().toISOString()
  });
  return result.written;
}
