/**
 * The read model must always equal the one built afresh from the studies it has been given: after any history of
 * writes, replacements, moves to another month, deletions and clashes applied in batches, and after a round trip
 * through its stored form. Its cells must show what `onePerMonth` keeps (study-month.ts).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { summariseMoments } from '../stats/pooled-moments';
import { formatStamp } from './hybrid-clock';
import {
  cellNumbersOf,
  columnsOfCellNumbers,
  MonthlyStatistics,
  periodOfOrdinal,
  type MonthlyStatisticsSnapshot
} from './monthly-statistics';
import { monthOrdinal } from './portfolio-index';
import type { Study, StudyData } from './study';
import { onePerMonth } from './study-month';

const CHARS = ['c0', 'c1', 'c2'];
const MONTHS = ['2025-11', '2025-12', '2026-01', '2026-02', '2027-06'];

const dataArb: fc.Arbitrary<StudyData> = fc.oneof(
  fc.record({
    kind: fc.constant('summary' as const),
    n: fc.integer({ min: 2, max: 80 }),
    mean: fc.double({ min: -5, max: 5, noNaN: true }),
    sd: fc.double({ min: 0.01, max: 3, noNaN: true })
  }),
  fc.record({
    kind: fc.constant('raw' as const),
    values: fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 1, maxLength: 6 })
  }),
  fc.record({
    kind: fc.constant('defectives' as const),
    units: fc.integer({ min: 1, max: 500 }),
    defectives: fc.integer({ min: 0, max: 1 })
  }),
  fc.record({
    kind: fc.constant('defects' as const),
    units: fc.integer({ min: 1, max: 500 }),
    defects: fc.integer({ min: 0, max: 9 }),
    opportunitiesPerUnit: fc.integer({ min: 1, max: 8 })
  })
);

const writeArb = fc.record({
  id: fc.integer({ min: 0, max: 7 }),
  char: fc.integer({ min: 0, max: CHARS.length - 1 }),
  month: fc.integer({ min: 0, max: MONTHS.length - 1 }),
  data: dataArb,
  deleted: fc.boolean(),
  wall: fc.integer({ min: 0, max: 50 }),
  batchEnd: fc.boolean()
});

/** A live study of characteristic c0. */
function plainStudy(id: string, period: string, data: StudyData): Study {
  return {
    id,
    rev: 1,
    createdAt: '',
    updatedAt: '',
    deviceId: 'd',
    characteristicId: 'c0',
    period,
    enteredBy: '',
    data
  };
}

/** Every non-empty cell as plain values, keyed by characteristic and month. */
function cellsOf(model: MonthlyStatistics): Map<string, unknown> {
  const out = new Map<string, unknown>();
  for (const c of CHARS) {
    const row = model.rowOf(c);
    if (row === undefined) continue;
    for (let m = model.firstMonth; m < model.firstMonth + model.span; m += 1) {
      const cell = model.cellOf(row, m);
      if (model.kind[cell] === 0) continue;
      out.set(`${c}|${periodOfOrdinal(m)}`, {
        id: model.ids[cell],
        kind: model.kind[cell],
        n: model.n[cell],
        mean: model.mean[cell],
        sd: model.sd[cell],
        units: model.units[cell],
        count: model.count[cell],
        opportunities: model.opportunities[cell],
        raw: model.studyAt(cell)?.data.kind === 'raw' ? model.studyAt(cell)!.data : undefined
      });
    }
  }
  return out;
}

/** What the cells must show: each month's study by onePerMonth, as numbers. */
function expectedCells(studies: readonly Study[]): Map<string, unknown> {
  const out = new Map<string, unknown>();
  const kinds = { raw: 1, summary: 2, defectives: 3, defects: 4 };
  for (const s of onePerMonth(studies)) {
    const d = s.data;
    const moments =
      d.kind === 'summary' ? d : d.kind === 'raw' ? summariseMoments(d.values) : { n: 0, mean: 0, sd: 0 };
    out.set(`${s.characteristicId}|${s.period}`, {
      id: s.id,
      kind: kinds[d.kind],
      n: moments.n,
      mean: moments.mean,
      sd: moments.sd,
      units: d.kind === 'defectives' || d.kind === 'defects' ? d.units : 0,
      count: d.kind === 'defectives' ? d.defectives : d.kind === 'defects' ? d.defects : 0,
      opportunities: d.kind === 'defects' ? d.opportunitiesPerUnit : 0,
      raw: d.kind === 'raw' ? d : undefined
    });
  }
  return out;
}

/** The model stored and read back; `packed`: with a cell's numbers in three columns, as storage keeps them. */
function roundTrip(
  model: MonthlyStatistics,
  stored: ReadonlyMap<string, Study>,
  packed = false
): MonthlyStatistics {
  const cloned = structuredClone(model.snapshot()) as MonthlyStatisticsSnapshot;
  const snap = packed ? { ...cloned, ...columnsOfCellNumbers(cloned.kind, cellNumbersOf(cloned)) } : cloned;
  const held = new Map(snap.heldIds.flatMap(([, ids]) => ids.map((id) => [id, stored.get(id)!] as const)));
  const { model: restored, missing } = MonthlyStatistics.fromSnapshot(snap, held);
  expect(missing).toEqual([]);
  return restored;
}

describe('monthly statistics read model', () => {
  it('numbers months both ways', () => {
    for (const p of ['0001-01', '1999-12', '2026-01', '2026-10', '9999-12'])
      expect(periodOfOrdinal(monthOrdinal(p))).toBe(p);
  });

  it('after any history of batched writes equals the model built from the final studies, also once stored and read back', () => {
    fc.assert(
      fc.property(fc.array(writeArb, { minLength: 1, maxLength: 40 }), (writes) => {
        const stored = new Map<string, Study>();
        let model = new MonthlyStatistics();
        let batch: Study[] = [];
        let rebuilds = 0;
        const flush = () => {
          model.putAll(batch);
          batch = [];
          if (model.needsRebuild) {
            // What the owner does (storage/portfolio-feed.ts): a clash it cannot weigh means a rebuild.
            rebuilds += 1;
            model = MonthlyStatistics.fromStudies([...stored.values()]);
          }
        };
        writes.forEach((w, i) => {
          const id = `s${w.id}`;
          const rev = (stored.get(id)?.rev ?? 0) + 1;
          const study: Study = {
            id,
            rev,
            createdAt: '',
            updatedAt: '',
            deviceId: i % 2 ? 'dev-a' : 'dev-b',
            clock: formatStamp({
              wallMs: 1_700_000_000_000 + w.wall,
              counter: 0,
              deviceId: i % 2 ? 'dev-a' : 'dev-b'
            }),
            characteristicId: CHARS[w.char]!,
            period: MONTHS[w.month]!,
            enteredBy: '',
            data: w.data,
            ...(w.deleted ? { deletedAt: '2026-01-01T00:00:00Z' } : {})
          } as Study;
          stored.set(id, study);
          batch.push(study);
          if (w.batchEnd) flush();
        });
        flush();
        const studies = [...stored.values()];
        const expected = expectedCells(studies);
        expect(cellsOf(model)).toEqual(expected);
        expect(cellsOf(MonthlyStatistics.fromStudies(studies))).toEqual(expected);
        expect(cellsOf(roundTrip(model, stored))).toEqual(expected);
        expect(cellsOf(roundTrip(model, stored, true))).toEqual(expected);
        // Built in pages of three, as storage rebuilds a large table.
        const paged = new MonthlyStatistics();
        for (let i = 0; i < studies.length; i += 3) paged.appendNew(studies.slice(i, i + 3));
        if (!paged.needsRebuild) expect(cellsOf(paged)).toEqual(expected);
        expect(model.known).toBe(stored.size);
        expect(rebuilds).toBeLessThanOrEqual(writes.length);
      }),
      { numRuns: 300 }
    );
  });

  it('skips a study it shows already with the same tag, so re-reading recent writes changes nothing', () => {
    const studies = ['2026-01', '2026-02'].map((period, i) => ({
      ...plainStudy(`s${i}`, period, { kind: 'defectives', units: 100, defectives: i }),
      localSeq: 10 + i
    }));
    const tagOf = (s: Study) => (s as Study & { localSeq: number }).localSeq;
    const model = MonthlyStatistics.fromStudies(studies, tagOf);
    const version = model.version;
    const stamps = model.rowStamp.slice();
    model.putAll(studies, tagOf);
    expect(model.version).toBe(version);
    expect(model.rowStamp).toEqual(stamps);
    model.putAll(
      [{ ...studies[1]!, localSeq: 12, data: { kind: 'defectives', units: 100, defectives: 7 } }],
      tagOf
    );
    expect(model.version).toBe(version + 1);
    expect([...model.count].filter((x) => x > 0)).toEqual([7]);
  });

  it("raises a row's stamp with every change in it, leaves other rows' alone and keeps them through growth and restore", () => {
    const study = (id: string, characteristicId: string, period: string, mean: number) => ({
      ...plainStudy(id, period, { kind: 'summary', n: 10, mean, sd: 1 }),
      characteristicId
    });
    const model = MonthlyStatistics.fromStudies([
      study('a', 'c0', '2026-01', 1),
      study('b', 'c1', '2026-01', 2)
    ]);
    const [r0, r1] = [model.rowOf('c0')!, model.rowOf('c1')!];
    const before = [model.rowStamp[r0]!, model.rowStamp[r1]!];
    expect(before.every((s) => s > 0)).toBe(true);
    // A month far outside the present ones reshapes the arrays: the other row's stamp moves with it.
    model.putAll([study('c', 'c0', '2029-06', 3)]);
    expect(model.rowStamp[r0]).toBeGreaterThan(before[0]!);
    expect(model.rowStamp[r1]).toBe(before[1]);
    const afterAdd = model.rowStamp[r0]!;
    model.putAll([{ ...study('c', 'c0', '2029-06', 3), rev: 2, deletedAt: '2026-12-01T00:00:00.000Z' }]);
    expect(model.rowStamp[r0]).toBeGreaterThan(afterAdd);
    expect(model.rowStamp[r1]).toBe(before[1]);
    // Restored, every row with a live month has a stamp (a new model: no window of the old one is asked of it).
    const restored = MonthlyStatistics.fromSnapshot(model.snapshot(), new Map()).model;
    expect(restored.rowStamp[restored.rowOf('c0')!]).toBeGreaterThan(0);
    expect(restored.rowStamp[restored.rowOf('c1')!]).toBeGreaterThan(0);
  });

  it('restored without its ids, refuses every change until they are attached, then takes them as a full restore does', () => {
    const studies = [
      plainStudy('a', '2025-11', { kind: 'summary', n: 20, mean: 1, sd: 0.5 }),
      plainStudy('b', '2026-01', { kind: 'defectives', units: 100, defectives: 2 }),
      plainStudy('c', '2026-02', { kind: 'summary', n: 30, mean: 2, sd: 0.4 })
    ];
    const model = MonthlyStatistics.fromStudies(studies);
    const { ids, ...withoutIds } = model.snapshot();
    const lazy = MonthlyStatistics.fromSnapshot(withoutIds, new Map()).model;
    expect(lazy.idsToAttach).toBe(true);
    expect(lazy.known).toBe(3);
    // Every figure a ranking reads is there; only the ids are not.
    const figures = (m: MonthlyStatistics) =>
      new Map([...cellsOf(m)].map(([k, v]) => [k, { ...(v as object), id: undefined }]));
    expect(figures(lazy)).toEqual(figures(model));
    const edit = plainStudy('c', '2026-02', { kind: 'summary', n: 30, mean: 3, sd: 0.4 });
    expect(() => lazy.putAll([edit])).toThrow(/without its ids/);
    expect(() => lazy.snapshot()).toThrow(/without its ids/);
    expect(lazy.snapshotWithoutIds()).toEqual(withoutIds);
    expect(() => lazy.attachIds(ids.slice(1))).toThrow(RangeError);
    // Ids whose empty month is elsewhere than the model's (2025-12) are not this model's.
    expect(() => lazy.attachIds([...ids.slice(1), ids[0]!])).toThrow(RangeError);
    lazy.attachIds(ids);
    expect(lazy.idsToAttach).toBe(false);
    lazy.putAll([edit]);
    model.putAll([edit]);
    expect(cellsOf(lazy)).toEqual(cellsOf(model));
    expect(lazy.snapshot()).toEqual(model.snapshot());
  });
});
