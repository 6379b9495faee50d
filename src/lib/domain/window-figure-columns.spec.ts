import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Characteristic } from './characteristic';
import type { StudyData } from './study';
import { WindowFigureColumns, type JudgedFigures, type PerUnitFigures } from './window-figure-columns';
import { windowFiguresOfStudy, type WindowFigures } from './window-figures';
import { WindowFiguresCache } from './window-figures-cache';

const characteristic = { lsl: 7, usl: 13, dataKind: 'measured' } as Pick<
  Characteristic,
  'lsl' | 'usl' | 'dataKind'
>;

/** Window data of every kind the ranking pools or analyses: summaries, counts, and raw values (the full analysis). */
const windowData: fc.Arbitrary<{ data: StudyData; sdWithin?: number }> = fc.oneof(
  fc
    .record({
      n: fc.integer({ min: 2, max: 5000 }),
      mean: fc.double({ min: 5, max: 15, noNaN: true }),
      sd: fc.double({ min: 1e-4, max: 5, noNaN: true }),
      within: fc.option(fc.double({ min: 1e-4, max: 5, noNaN: true }), { nil: undefined })
    })
    .map(({ n, mean, sd, within }) => ({
      data: { kind: 'summary', n, mean, sd } as StudyData,
      ...(within !== undefined ? { sdWithin: within } : {})
    })),
  fc
    .record({
      units: fc.integer({ min: 1, max: 100_000 }),
      share: fc.double({ min: 0, max: 1, noNaN: true })
    })
    .map(({ units, share }) => ({
      data: { kind: 'defectives', units, defectives: Math.floor(units * share) } as StudyData
    })),
  fc
    .record({
      units: fc.integer({ min: 1, max: 100_000 }),
      defects: fc.integer({ min: 0, max: 5000 }),
      opportunitiesPerUnit: fc.integer({ min: 1, max: 20 })
    })
    .map((d) => ({
      data: {
        kind: 'defects',
        ...d,
        defects: Math.min(d.defects, d.units * d.opportunitiesPerUnit)
      } as StudyData
    })),
  fc
    .array(fc.double({ min: 8, max: 12, noNaN: true }), { minLength: 5, maxLength: 40 })
    .map((values) => ({ data: { kind: 'raw', values } as StudyData }))
);

const unitOf = (f: WindowFigures): PerUnitFigures => ({
  z: f.zLevel,
  zBound: f.zLevelLower,
  fraction: 1 - f.yield,
  fractionBound: f.fractionUpper
});

describe('window figure columns', () => {
  it('give back every window exactly as written, field for field (property)', () => {
    fc.assert(
      fc.property(fc.array(windowData, { minLength: 1, maxLength: 8 }), (windows) => {
        const columns = new WindowFigureColumns(100, 102);
        const written = windows.map(({ data, sdWithin }) =>
          windowFiguresOfStudy({ data, period: '2026-03' }, characteristic, sdWithin)
        );
        written.forEach((f, row) => columns.write(row, 1, 1, f, 3, false, unitOf(f), 0));
        written.forEach((f, row) => {
          expect(columns.figuresAt(row)).toStrictEqual(f);
          const judged: JudgedFigures = { kind: 'summary' };
          const unit: PerUnitFigures = { z: NaN, zBound: undefined, fraction: NaN, fractionBound: undefined };
          columns.readJudged(row, judged, unit);
          expect(judged).toStrictEqual({
            kind: f.kind,
            cpk: f.cpk,
            ppk: f.ppk,
            cpkLower: f.cpkLower,
            ppkLower: f.ppkLower,
            stable: f.stable
          });
          expect(unit).toStrictEqual(unitOf(f));
        });
      }),
      { numRuns: 200, seed: 20261205 }
    );
  });

  it('keep as the object a window with a NaN of its own, which a column would read back as not known', () => {
    const columns = new WindowFigureColumns(100, 102);
    const f = windowFiguresOfStudy(
      { data: { kind: 'summary', n: 50, mean: 10, sd: 0.5 }, period: '2026-03' },
      characteristic,
      undefined
    );
    const odd = { ...f, cpk: NaN };
    columns.write(0, 1, 1, odd, 3, false, unitOf(f), 0);
    expect(columns.keptAt(0)).toBe(odd);
    expect(columns.figuresAt(0)).toBe(odd);
    columns.write(0, 2, 1, f, 3, false, unitOf(f), 0);
    expect(columns.keptAt(0)).toBeUndefined();
    expect(columns.figuresAt(0)).toStrictEqual(f);
  });

  it('hold a row only for the revision and row stamp it was computed from, and keep rows as they grow', () => {
    const columns = new WindowFigureColumns(100, 102);
    expect(columns.holds(0, 1, 1)).toBe(false);
    columns.write(3, 2, 7, undefined, 0, true, undefined, 0);
    expect(columns.holds(3, 2, 7)).toBe(true);
    expect(columns.holds(3, 3, 7)).toBe(false);
    expect(columns.holds(3, 2, 8)).toBe(false);
    expect(columns.holds(2, 2, 7)).toBe(false);
    columns.ensure(10_000);
    expect(columns.holds(3, 2, 7)).toBe(true);
    expect(columns.limitsChangedAt(3)).toBe(true);
    expect(columns.figuresAt(3)).toBeUndefined();
    expect(columns.size).toBe(1);
    expect(columns.computed).toBe(1);
  });
});

describe('window figures cache', () => {
  it('finds the columns of a window again for the same model and months', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    const q = cache.columns(model, 100, 102);
    expect(cache.columns(model, 100, 102)).toBe(q);
    expect(cache.columns(model, 101, 102)).not.toBe(q);
    expect(cache.columns(model, 100, 103)).not.toBe(q);
  });

  it('starts afresh when it is given another model', () => {
    const cache = new WindowFiguresCache();
    const before = {};
    const q = cache.columns(before, 100, 102);
    q.write(0, 1, 1, undefined, 0, false, undefined, 0);
    expect(cache.size).toBe(1);
    const after = {};
    expect(cache.columns(after, 100, 102)).not.toBe(q);
    expect(cache.size).toBe(0);
  });

  it('keeps the 16 windows asked for most recently', () => {
    const cache = new WindowFiguresCache();
    const model = {};
    const first = cache.columns(model, 0, 2);
    const second = cache.columns(model, 1, 3);
    for (let i = 2; i < 16; i += 1) cache.columns(model, i, i + 2);
    // Asked for again: the most recent, so the second is the one dropped for the seventeenth.
    expect(cache.columns(model, 0, 2)).toBe(first);
    cache.columns(model, 16, 18);
    expect(cache.columns(model, 0, 2)).toBe(first);
    expect(cache.columns(model, 1, 3)).not.toBe(second);
  });
});
