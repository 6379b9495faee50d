import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isLive } from './record-meta';
import type { Study } from './study';
import { liveMonthClashes, StudyMonthSet, studyMonthKey } from './study-month';

function study(id: string, characteristicId: string, period: string, deleted = false): Study {
  return {
    id,
    rev: 1,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
    deviceId: 'd',
    characteristicId,
    period,
    enteredBy: '',
    data: { kind: 'summary', n: 5, mean: 1, sd: 1 },
    ...(deleted ? { deletedAt: '2026-01-02T00:00:00.000Z' } : {})
  };
}

/** The rule as written plainly: live studies grouped by studyMonthKey, groups of two or more, in id order. */
function plainClashes(studies: readonly Study[]): Study[][] {
  const byKey = new Map<string, Study[]>();
  for (const s of studies.filter(isLive))
    byKey.set(studyMonthKey(s), [...(byKey.get(studyMonthKey(s)) ?? []), s]);
  return [...byKey.values()]
    .filter((g) => g.length > 1)
    .map((g) => [...g].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)));
}

describe('liveMonthClashes', () => {
  it('groups live studies of one characteristic and month, in id order, and leaves deleted ones out', () => {
    const studies = [
      study('s3', 'c1', '2026-01'),
      study('s1', 'c1', '2026-02'),
      study('s2', 'c1', '2026-01'),
      study('s4', 'c1', '2026-02', true),
      study('s5', 'c2', '2026-01')
    ];
    expect(liveMonthClashes(studies).map((g) => g.map((s) => s.id))).toEqual([['s2', 's3']]);
  });

  it('gives the groups in the order of their first study, as the plain grouping by month key does', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            characteristic: fc.constantFrom('c1', 'c2', 'c|3', 'c'),
            month: fc.constantFrom('2026-01', '2026-02', '2026-03'),
            deleted: fc.boolean()
          }),
          { maxLength: 40 }
        ),
        (drawn) => {
          const studies = drawn.map((d, i) =>
            study(`s${(i * 7919) % 101}-${i}`, d.characteristic, d.month, d.deleted)
          );
          expect(liveMonthClashes(studies)).toEqual(plainClashes(studies));
        }
      ),
      { numRuns: 300, seed: 7 }
    );
  });
});

/** Characteristic-months from a few ids (one holding the key's separator) and two months. */
const months = fc.array(
  fc.record({
    characteristicId: fc.constantFrom('c1', 'c2', 'c|2026-01', 'c'),
    period: fc.constantFrom('2026-01', '2026-02')
  }),
  { maxLength: 12 }
);

describe('StudyMonthSet', () => {
  it('holds exactly the characteristic-months added, as a set of studyMonthKey strings does', () => {
    fc.assert(
      fc.property(months, months, (added, asked) => {
        const set = new StudyMonthSet();
        const keys = new Set<string>();
        for (const a of added) {
          set.add(a);
          keys.add(studyMonthKey(a));
        }
        for (const a of [...added, ...asked]) expect(set.has(a)).toBe(keys.has(studyMonthKey(a)));
      }),
      { numRuns: 300, seed: 11 }
    );
  });
});
