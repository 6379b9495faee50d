import { describe, expect, it } from 'vitest';
import { MonthlyStatistics } from './monthly-statistics';
import { quarterCoverage } from './quarter-coverage';
import type { Study } from './study';

const meta = (id: string) => ({ id, createdAt: '', updatedAt: '', rev: 1, deviceId: 'd' });
const study = (id: string, characteristicId: string, period: string, deleted = false): Study => ({
  ...meta(id),
  characteristicId,
  period,
  enteredBy: '',
  data: { kind: 'defectives', units: 100, defectives: 1 },
  ...(deleted ? { deletedAt: '2026-01-01T00:00:00Z' } : {})
});

describe('quarter coverage', () => {
  it('counts, per site and month, the characteristics with a live study, against characteristics × months', () => {
    const records = {
      sites: [
        { ...meta('s-b'), name: 'Bexley', region: '', timeZone: 'UTC' },
        { ...meta('s-a'), name: 'Arnhem', region: '', timeZone: 'UTC' }
      ],
      processes: [
        {
          ...meta('p1'),
          siteId: 's-a',
          name: 'P1',
          owner: '',
          contextId: 'x',
          monthlyVolume: 1,
          costPerDefective: 1,
          currency: 'EUR'
        },
        {
          ...meta('p2'),
          siteId: 's-b',
          name: 'P2',
          owner: '',
          contextId: 'x',
          monthlyVolume: 1,
          costPerDefective: 1,
          currency: 'EUR'
        }
      ],
      characteristics: ['c1', 'c2', 'c3'].map((id, i) => ({
        ...meta(id),
        processId: i < 2 ? 'p1' : 'p2',
        name: id,
        unit: '',
        dataKind: 'counted' as const,
        riskClass: 'standard' as const
      })),
      projects: []
    };
    const model = MonthlyStatistics.fromStudies([
      study('a', 'c1', '2026-04'),
      study('b', 'c2', '2026-04'),
      study('c', 'c1', '2026-06'),
      study('d', 'c3', '2026-05', true), // deleted: not logged
      study('e', 'c3', '2025-11')
    ]);
    const coverage = quarterCoverage(records, model, '2026-Q2');
    expect(coverage.periods).toEqual(['2026-04', '2026-05', '2026-06']);
    expect(coverage.sites).toEqual([
      {
        siteId: 's-a',
        siteName: 'Arnhem',
        processes: 1,
        characteristics: 2,
        loggedByMonth: [2, 0, 1],
        expected: 6
      },
      {
        siteId: 's-b',
        siteName: 'Bexley',
        processes: 1,
        characteristics: 1,
        loggedByMonth: [0, 0, 0],
        expected: 3
      }
    ]);
    expect(coverage.quartersWithData).toEqual(['2026-Q2', '2025-Q4']);
  });
});
