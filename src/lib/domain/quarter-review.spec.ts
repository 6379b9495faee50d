import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from './context-profile';
import { parseDemoPortfolio } from './demo-portfolio';
import type { ProcessRow } from './portfolio-ranking';
import { buildQuarterReview, headlineOf, shiftQuarter } from './quarter-review';
import { reviewFiguresSchema } from './review-figures';

const row = (status: string, currency: string, cost: number | undefined, badges: string[] = []) =>
  ({ status, process: { currency }, costPerYear: cost, badges }) as unknown as ProcessRow;

describe('quarterly review', () => {
  it('aggregates the headline by hand-checked counts', () => {
    const rows = [
      row('meets, shown', 'EUR', 100),
      row('meets, not shown', 'EUR', 250.5),
      row('short', 'USD', 1000, ['incomplete']),
      row('short', 'EUR', 50),
      row('no recent data', 'EUR', undefined)
    ];
    // 4 reviewed (one has no data); 2 meet (1 shown): shares 2/4 and 1/4; one reviewed process is incomplete.
    // Cost per currency: EUR 100 + 250.5 + 50 = 400.5, USD 1000.
    expect(headlineOf('2026-Q3', rows)).toEqual({
      quarter: '2026-Q3',
      processes: 5,
      reviewed: 4,
      meeting: 2,
      meetingShown: 1,
      share: 0.5,
      shareShown: 0.25,
      cost: [
        { currency: 'EUR', perYear: 400.5 },
        { currency: 'USD', perYear: 1000 }
      ],
      stale: 1,
      missing: 1
    });
    expect(headlineOf('2026-Q3', []).share).toBeUndefined();
  });

  it('steps quarters across years', () => {
    expect(shiftQuarter('2026-Q1', -1)).toBe('2025-Q4');
    expect(shiftQuarter('2026-Q3', -4)).toBe('2025-Q3');
    expect(shiftQuarter('2025-Q4', 1)).toBe('2026-Q1');
  });

  it('builds a review of the demo portfolio that its own schema accepts, scoped to chosen sites', () => {
    const records = parseDemoPortfolio(demo).records;
    const figures = buildQuarterReview(records, BUILT_IN_PROFILES, { quarter: '2026-Q3' });
    expect(reviewFiguresSchema.parse(figures)).toEqual(figures);
    expect(figures.headline.processes).toBe(32);
    expect(figures.previousQuarter).toBe('2026-Q2');
    expect(figures.yearAgoQuarter).toBe('2025-Q3');
    expect(figures.shareTrend.map((t) => t.quarter)).toEqual([
      '2024-Q4',
      '2025-Q1',
      '2025-Q2',
      '2025-Q3',
      '2025-Q4',
      '2026-Q1',
      '2026-Q2',
      '2026-Q3'
    ]);
    expect(figures.shareTrend.at(-1)?.share).toBe(figures.headline.share);
    expect(figures.pipeline.reduce((a, p) => a + p.projects, 0)).toBe(8);
    for (const m of [...figures.improvers, ...figures.decliners]) expect(m.beyondNoise).toBe(true);
    expect(figures.improvers.every((m) => m.change > 0)).toBe(true);
    expect(figures.sites.reduce((a, s) => a + s.processes, 0)).toBe(32);
    const one = records.sites[0]!;
    const scoped = buildQuarterReview(records, BUILT_IN_PROFILES, { quarter: '2026-Q3', siteIds: [one.id] });
    expect(scoped.sites.map((s) => s.siteId)).toEqual([one.id]);
    expect(scoped.headline.processes).toBe(records.processes.filter((p) => p.siteId === one.id).length);
  });
});
