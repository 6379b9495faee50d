import { describe, expect, it } from 'vitest';
import { expectRelative } from '../../../tests/support/reference-data';
import { mean, sampleSd, sampleVariance } from '../stats/moments';
import { summariseValues } from './combine-study-data';
import type { RecordMeta } from './record-meta';
import type { Study, StudyData, SummaryData } from './study';
import { windowData } from './window-study';

const meta: RecordMeta = { id: 'x', createdAt: '', updatedAt: '', rev: 1, deviceId: 'd' };
const study = (period: string, data: StudyData): Study => ({
  ...meta,
  id: period,
  characteristicId: 'c',
  period,
  data,
  enteredBy: ''
});

const months = [
  [10.1, 10.3, 9.9, 10.0, 10.2],
  [10.6, 10.8, 10.5, 10.7],
  [9.7, 9.9, 9.8, 10.0, 9.6, 9.9]
];

describe('window data', () => {
  it('pools raw months with each month as a subgroup', () => {
    const w = windowData(months.map((v, i) => study(`2026-0${i + 1}`, { kind: 'raw', values: v })))!;
    expect(w.data.kind).toBe('raw');
    expect((w.data as { subgroups: string[] }).subgroups.slice(0, 6)).toEqual([
      '2026-01',
      '2026-01',
      '2026-01',
      '2026-01',
      '2026-01',
      '2026-02'
    ]);
  });

  it('merged monthly summaries equal the pooled raw data to 1e-12, and the within sd excludes the shift between months', () => {
    const w = windowData(months.map((v, i) => study(`2026-0${i + 1}`, summariseValues(v))))!;
    const all = months.flat();
    const d = w.data as SummaryData;
    expect(d.n).toBe(all.length);
    expectRelative(d.mean, mean(all), 1e-12);
    expectRelative(d.sd, sampleSd(all), 1e-12);
    const pooledWithin = Math.sqrt(
      months.reduce((a, v) => a + (v.length - 1) * sampleVariance(v), 0) /
        months.reduce((a, v) => a + v.length - 1, 0)
    );
    expectRelative(w.sdWithin, pooledWithin, 1e-12);
    expect(w.sdWithin!).toBeLessThan(d.sd);
  });

  it('sums counts, and defects with different opportunities on a per-opportunity basis', () => {
    expect(
      windowData([
        study('2026-01', { kind: 'defectives', units: 100, defectives: 1 }),
        study('2026-02', { kind: 'defectives', units: 50, defectives: 2 })
      ])!.data
    ).toEqual({ kind: 'defectives', units: 150, defectives: 3 });
    expect(
      windowData([
        study('2026-01', { kind: 'defects', units: 10, defects: 1, opportunitiesPerUnit: 4 }),
        study('2026-02', { kind: 'defects', units: 10, defects: 2, opportunitiesPerUnit: 5 })
      ])!.data
    ).toEqual({ kind: 'defects', units: 90, defects: 3, opportunitiesPerUnit: 1 });
    expect(windowData([])).toBeUndefined();
  });
});
