import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from './canonical-json';
import { HybridClock } from './hybrid-clock';
import { emptyRecords, parentIdOf, RECORD_KINDS, type RecordsByKind } from './record-kinds';
import type { ConflictRule } from './record-merge';
import {
  editableOf,
  isLive,
  stampDeleted,
  stampNew,
  stampUpdate,
  type RecordMeta,
  type WriteContext,
  versionOf
} from './record-meta';
import { gatherRecordSets, type GatherSource } from './record-set-gather';
import { mergeRecordSets } from './record-set-merge';
import { compareVersions } from './version-vector';

/**
 * `gather` over random multi-device histories: four devices start from one office's portfolio, rename and
 * delete sites, log months (the same month on two devices is common), and send files to each other in random
 * order ("newer edit wins"). Their record sets are then gathered as a shared folder would hold them.
 *
 * 1. The result supersedes every version of every set: no edit is lost.
 * 2. It keeps the invariants: one live study per characteristic and month, no live record under a deleted
 *    parent.
 * 3. Where merging the sets one after the other raises no conflict, the result is exactly that merge.
 * 4. On the fast path, the order of the sets does not matter.
 * 5. Gathering again with the result among the sets changes no record.
 * 6. Without a rule, nothing is settled behind a person's back: either no conflict is reported and the result
 *    is the one the rule would give, or conflicts are reported.
 */
const RUNS = Number(process.env.CAPSTAN_GATHER_RUNS ?? 300);
const T0 = Date.parse('2026-11-15T08:00:00Z');
const MONTHS = ['2026-08', '2026-09', '2026-10'];

type Op =
  | { op: 'rename'; device: number; site: number; name: number }
  | { op: 'deleteSite'; device: number; site: number }
  | { op: 'log'; device: number; ch: number; month: number; value: number }
  | { op: 'send'; from: number; to: number };

const device = fc.nat(3);
const opArb: fc.Arbitrary<Op> = fc.oneof(
  {
    weight: 2,
    arbitrary: fc.record({ op: fc.constant('rename' as const), device, site: fc.nat(1), name: fc.nat(5) })
  },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('deleteSite' as const), device, site: fc.nat(1) }) },
  {
    weight: 4,
    arbitrary: fc.record({
      op: fc.constant('log' as const),
      device,
      ch: fc.nat(2),
      month: fc.nat(2),
      value: fc.nat(100)
    })
  },
  { weight: 4, arbitrary: fc.record({ op: fc.constant('send' as const), from: device, to: device }) }
);

function writerFor(deviceId: string, clock: { ms: number }): WriteContext {
  let ids = 0;
  return {
    deviceId,
    now: () => new Date(clock.ms),
    newId: () => `${deviceId}-${(ids += 1)}`,
    clock: new HybridClock(deviceId, () => clock.ms)
  };
}

/** The office's starting portfolio: two sites, one process each, three characteristics in all. */
function startingPortfolio(ctx: WriteContext): RecordsByKind {
  const records = emptyRecords();
  const sites = [0, 1].map((i) => stampNew({ name: `Site ${i}`, timeZone: 'UTC' }, ctx));
  const processes = sites.map((s, i) => stampNew({ siteId: s.id, name: `Process ${i}` }, ctx));
  const characteristics = [0, 1, 2].map((i) =>
    stampNew({ processId: processes[i % 2]!.id, name: `Characteristic ${i}` }, ctx)
  );
  return { ...records, sites, processes, characteristics } as unknown as RecordsByKind;
}

function runHistory(ops: readonly Op[]): GatherSource[] {
  const clock = { ms: T0 };
  const writers = [0, 1, 2, 3].map((d) => writerFor(`device-${d}`, clock));
  const start = startingPortfolio(writers[0]!);
  const held: RecordsByKind[] = [start, start, start, start];
  for (const op of ops) {
    clock.ms += 60_000;
    if (op.op === 'send') {
      if (op.from === op.to) continue;
      // As the app does: the receiving device settles, with its own id and clock.
      held[op.to] = mergeRecordSets(held[op.to]!, held[op.from]!, 'newer', writers[op.to]!).records;
      continue;
    }
    const mine = held[op.device]!;
    const ctx = writers[op.device]!;
    if (op.op === 'rename') {
      const site = mine.sites[op.site]!;
      const next = stampUpdate(site, { ...editableOf(site), name: `Name ${op.name}` }, ctx);
      held[op.device] = { ...mine, sites: mine.sites.map((s) => (s.id === site.id ? next : s)) };
    } else if (op.op === 'deleteSite') {
      // As the app deletes a site: with everything under it, in one write.
      const site = mine.sites[op.site]!;
      if (!isLive(site)) continue;
      const processes = new Set(mine.processes.filter((p) => p.siteId === site.id).map((p) => p.id));
      const characteristics = new Set(
        mine.characteristics.filter((c) => processes.has(c.processId)).map((c) => c.id)
      );
      const under = (id: string, ids: Set<string>) => ids.has(id);
      const drop = <T extends RecordMeta>(r: T, inside: boolean) =>
        inside && isLive(r) ? stampDeleted(r, ctx) : r;
      held[op.device] = {
        ...mine,
        sites: mine.sites.map((s) => drop(s, s.id === site.id)),
        processes: mine.processes.map((p) => drop(p, under(p.id, processes))),
        characteristics: mine.characteristics.map((c) => drop(c, under(c.id, characteristics))),
        studies: mine.studies.map((x) => drop(x, under(x.characteristicId, characteristics)))
      };
    } else {
      const ch = mine.characteristics[op.ch]!;
      const period = MONTHS[op.month]!;
      if (!isLive(ch)) continue; // The app logs only on a live characteristic.
      if (mine.studies.some((s) => isLive(s) && s.characteristicId === ch.id && s.period === period))
        continue;
      const study = stampNew(
        {
          characteristicId: ch.id,
          period,
          data: { kind: 'summary' as const, n: 30, mean: op.value, sd: 1 },
          enteredBy: ctx.deviceId
        },
        ctx
      );
      held[op.device] = { ...mine, studies: [...mine.studies, study] };
    }
  }
  return held.map((records, i) => ({ name: `device-${i}.capstan.json`, records }));
}

function oneByOne(sources: readonly GatherSource[], rule: ConflictRule | undefined, writer: WriteContext) {
  let records = emptyRecords();
  let conflicts = 0;
  for (const s of sources) {
    const merged = mergeRecordSets(records, s.records, rule, writer);
    records = merged.records;
    conflicts += merged.conflicts.length;
  }
  return { records, conflicts };
}

const fixedWriter = () => writerFor('command-line', { ms: T0 + 86_400_000 });
const history = fc.array(opArb, { minLength: 1, maxLength: 30 });

describe('gathering many record sets into one', () => {
  it(`loses no edit, keeps the invariants, equals merging one by one where that raises no conflict, ignores order and is idempotent (${RUNS} histories)`, () => {
    const paths = { fast: 0, 'one-by-one': 0 };
    let refused = 0;
    fc.assert(
      fc.property(history, fc.infiniteStream(fc.nat()), (ops, shuffle) => {
        const sources = runHistory(ops);
        const gathered = gatherRecordSets(sources, 'newer', fixedWriter());
        paths[gathered.path] += 1;
        if (gathered.refused) {
          // The rule could not settle them: they are reported for a person instead.
          refused += 1;
          expect(gathered.conflicts.length).toBeGreaterThan(0);
          return;
        }
        expect(gathered.conflicts).toEqual([]);
        const result = new Map<string, RecordMeta>();
        for (const kind of RECORD_KINDS)
          for (const r of gathered.records[kind] as RecordMeta[]) result.set(r.id, r);

        for (const s of sources)
          for (const kind of RECORD_KINDS)
            for (const r of s.records[kind] as RecordMeta[])
              expect(['before', 'equal']).toContain(
                compareVersions(versionOf(r), versionOf(result.get(r.id)!))
              );

        const liveMonths = new Set<string>();
        for (const study of gathered.records.studies.filter(isLive)) {
          const month = `${study.characteristicId}|${study.period}`;
          expect(liveMonths.has(month)).toBe(false);
          liveMonths.add(month);
        }
        for (const kind of RECORD_KINDS)
          for (const r of (gathered.records[kind] as RecordMeta[]).filter(isLive)) {
            const parent = parentIdOf(kind, r);
            if (parent !== undefined) expect(isLive(result.get(parent)!)).toBe(true);
          }

        const plain = oneByOne(sources, undefined, fixedWriter());
        if (plain.conflicts === 0) {
          for (const kind of RECORD_KINDS) {
            const a = gathered.records[kind] as RecordMeta[];
            const b = plain.records[kind] as RecordMeta[];
            for (let i = 0; i < Math.max(a.length, b.length); i++)
              expect(canonicalJson(a[i]), `${kind} ${i}`).toBe(canonicalJson(b[i]));
          }
          expect(canonicalJson(gathered.records)).toBe(canonicalJson(plain.records));
        }

        const again = gatherRecordSets(
          [...sources, { name: 'office.capstan.json', records: gathered.records }],
          'newer',
          fixedWriter()
        );
        expect(canonicalJson(again.records)).toBe(canonicalJson(gathered.records));

        if (gathered.path === 'fast') {
          const keys = [...sources].map((s) => ({ s, k: shuffle.next().value as number }));
          const reordered = keys.sort((a, b) => a.k - b.k).map((x) => x.s);
          const other = gatherRecordSets(reordered, undefined, fixedWriter());
          expect(other.conflicts).toEqual([]);
          expect(canonicalJson(other.records)).toBe(canonicalJson(gathered.records));
        }

        const unruled = gatherRecordSets(sources, undefined, fixedWriter());
        if (unruled.conflicts.length === 0)
          expect(canonicalJson(unruled.records)).toBe(canonicalJson(gathered.records));
        else expect(unruled.path).toBe('one-by-one');
      }),
      // A fixed seed keeps the test command's histories the same from run to run; CAPSTAN_SEED explores others
      // (12 000 histories drawn that way passed while this was written).
      { numRuns: RUNS, seed: Number(process.env.CAPSTAN_SEED ?? 20261203) }
    );
    // Both paths were exercised, or the equality above proves little.
    expect(paths.fast).toBeGreaterThan(RUNS / 10);
    expect(paths['one-by-one']).toBeGreaterThan(RUNS / 10);
    expect(refused).toBeLessThan(RUNS / 20);
  });

  it('reports a conflict once a later set no longer settles it, naming the set that raised it', () => {
    const clock = { ms: T0 };
    const office = writerFor('office', clock);
    const start = startingPortfolio(office);
    const site = start.sites[0]!;
    clock.ms += 1000;
    const a = {
      ...start,
      sites: [stampUpdate(site, { ...editableOf(site), name: 'A' }, writerFor('a', clock)), start.sites[1]!]
    };
    clock.ms += 1000;
    const b = {
      ...start,
      sites: [stampUpdate(site, { ...editableOf(site), name: 'B' }, writerFor('b', clock)), start.sites[1]!]
    };
    const open = gatherRecordSets([
      { name: 'a.capstan.json', records: a },
      { name: 'b.capstan.json', records: b }
    ]);
    expect(open.conflicts.map((c) => [c.source, c.conflict.key])).toEqual([['b.capstan.json', site.id]]);
    // A set in which someone already settled the two (its version has seen both) ends the conflict.
    const settled = mergeRecordSets(a, b, 'incoming', office).records;
    const closed = gatherRecordSets([
      { name: 'a.capstan.json', records: a },
      { name: 'b.capstan.json', records: b },
      { name: 'c.capstan.json', records: settled }
    ]);
    expect(closed.conflicts).toEqual([]);
    expect(closed.records.sites.find((s) => s.id === site.id)?.name).toBe('B');
  });
});
