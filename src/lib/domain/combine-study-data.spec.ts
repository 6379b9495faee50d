import { describe, expect, it } from 'vitest';
import { expectRelative } from '../../../tests/support/reference-data';
import { mean, sampleSd } from '../stats/moments';
import { combineStudyData, poolSummaries, summariseValues } from './combine-study-data';
import type { SummaryData } from './study';

function months(): number[][] {
  let s = 3;
  const u = () => (s = (s * 48271) % 2147483647) / 2147483647;
  // Three months whose means shift: the between-month shift must show in the pooled sd.
  return [20, 35, 50].map((n, m) =>
    Array.from(
      { length: n },
      () => 10 + 0.3 * m + Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u())
    )
  );
}

describe('combining studies exactly', () => {
  it('pooled monthly summaries equal the figures of the pooled raw data to 1e-12', () => {
    const data = months();
    const pooled = data.map((v) => summariseValues(v)).reduce((a, b) => poolSummaries(a, b));
    const all = data.flat();
    expect(pooled.n).toBe(all.length);
    expectRelative(pooled.mean, mean(all), 1e-12);
    expectRelative(pooled.sd, sampleSd(all), 1e-12);
  });

  it('concatenates raw values and keeps subgroups apart', () => {
    const r = combineStudyData(
      { kind: 'raw', values: [1, 2], subgroups: ['a', 'a'] },
      { kind: 'raw', values: [3, 4] }
    );
    expect(r).toEqual({ kind: 'raw', values: [1, 2, 3, 4], subgroups: ['a', 'a', 'added', 'added'] });
  });

  it('pools a summary with raw values', () => {
    const raw = [9.8, 10.1, 10.3, 9.9];
    const summary: SummaryData = { kind: 'summary', n: 30, mean: 10, sd: 0.2 };
    const r = combineStudyData(summary, { kind: 'raw', values: raw });
    expect(r.kind).toBe('summary');
    expect((r as SummaryData).n).toBe(34);
  });

  it('adds counts and refuses what cannot be combined', () => {
    expect(
      combineStudyData(
        { kind: 'defectives', units: 100, defectives: 2 },
        { kind: 'defectives', units: 50, defectives: 1 }
      )
    ).toEqual({ kind: 'defectives', units: 150, defectives: 3 });
    expect(() =>
      combineStudyData(
        { kind: 'defects', units: 10, defects: 1, opportunitiesPerUnit: 4 },
        { kind: 'defects', units: 10, defects: 1, opportunitiesPerUnit: 5 }
      )
    ).toThrow(/5 opportunities per unit cannot be combined with the 4/);
    expect(() =>
      combineStudyData({ kind: 'defectives', units: 10, defectives: 1 }, { kind: 'raw', values: [1] })
    ).toThrow(/raw data cannot be combined with the defectives/);
  });
});
