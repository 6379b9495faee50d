import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from './context-profile';
import { parseDemoPortfolio } from './demo-portfolio-schema';
import { portfolioStandings, rankPortfolio, standingOfRow, type ProcessRow } from './portfolio-ranking';
import { buildQuarterReview, headlineOf, shiftQuarter, snapshotDifferences } from './quarter-review';
import { reviewFiguresSchema } from './review-figures';

const row = (status: string, currency: string, cost: number | undefined, badges: string[] = []) =>
  standingOfRow({ status, process: { currency }, costPerYear: cost, badges } as unknown as ProcessRow);

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

describe('the trend quarters and the year-ago quarter judged without rows', () => {
  it("give each live process the standing its full ranking row has, in the records' order", () => {
    const records = parseDemoPortfolio(demo).records;
    for (const endPeriod of ['2025-03', '2026-06', '2026-09']) {
      const options = { endPeriod, windowMonths: 3, trendMonths: 0 };
      const rows = rankPortfolio(records, BUILT_IN_PROFILES, options);
      const byId = new Map(rows.map((r) => [r.process.id, standingOfRow(r)]));
      const live = records.processes.filter((p) => !p.deletedAt && !p.archivedAt);
      const standings = portfolioStandings(records, BUILT_IN_PROFILES, options);
      expect(standings).toEqual(live.map((p) => byId.get(p.id)));
      // The demo has every status in these quarters, so the comparison above is not between empty lists.
      expect(new Set(standings.map((s) => s.status)).size).toBeGreaterThan(2);
    }
  });

  it('are kept per window and judging, yet follow every change of target, as if judged from scratch', () => {
    const records = parseDemoPortfolio(demo).records;
    const options = { endPeriod: '2026-09', windowMonths: 3, trendMonths: 0 };
    // Stricter and looser targets for every context, then the built-in ones again: each must be judged anew
    // (kept standings found for the built-in targets the second time), never found under another target's key.
    const scaled = (f: number) =>
      BUILT_IN_PROFILES.map((p) => ({
        ...p,
        levels: { standard: p.levels.standard * f, key: p.levels.key * f, safety: p.levels.safety * f }
      }));
    const seen = new Set<string>();
    for (const profiles of [BUILT_IN_PROFILES, scaled(1.3), scaled(0.7), BUILT_IN_PROFILES]) {
      const kept = portfolioStandings(records, profiles, options);
      // From scratch: a record set of its own (another read model, so another plan): nothing judged before is found.
      const fresh = portfolioStandings({ ...records, studies: [...records.studies] }, profiles, options);
      expect(kept).toEqual(fresh);
      seen.add(kept.map((s) => s.status).join());
    }
    // The targets changed the statuses (the comparison is not between unchanged lists).
    expect(seen.size).toBeGreaterThan(1);
  });
});

describe("the projects' before-and-after figures", () => {
  it('take "before" from a full ranking of the quarter before each project started', () => {
    const records = parseDemoPortfolio(demo).records;
    const figures = buildQuarterReview(records, BUILT_IN_PROFILES, { quarter: '2026-Q3' });
    // The demo's Control projects have figures before they started, so the comparison is not of empty values.
    expect(figures.control.filter((c) => c.zBefore !== undefined).length).toBeGreaterThan(1);
    for (const c of figures.control) {
      const q = c.beforeQuarter;
      const endPeriod = `${q.slice(0, 4)}-${String(Number(q.slice(6)) * 3).padStart(2, '0')}`;
      const full = rankPortfolio(records, BUILT_IN_PROFILES, { endPeriod, windowMonths: 3, trendMonths: 0 });
      const project = records.projects.find((p) => p.id === c.projectId)!;
      const before = full.find((r) => r.process.id === project.processId);
      expect(c.zBefore).toBe(before?.zLevel);
      expect(c.costBefore).toBe(before?.costPerYear);
    }
  });
});

describe('amounts in several currencies', () => {
  const r = parseDemoPortfolio(demo).records;
  const end = r.studies.reduce((a, s) => (s.period > a ? s.period : a), '');
  const quarter = `${end.slice(0, 4)}-Q${Math.floor((Number(end.slice(5, 7)) - 1) / 3) + 1}`;

  it('never adds EUR and INR: pipeline savings stay per currency without a reporting currency', () => {
    const f = buildQuarterReview(r, BUILT_IN_PROFILES, { quarter });
    const control = f.pipeline.find((p) => p.phase === 'Control')!;
    // Demo Control projects: EUR 61 000 and 72 000, INR 5 400 000 (seed-data/demo-portfolio.json).
    expect(control.savings).toEqual([
      { currency: 'EUR', perYear: 133_000 },
      { currency: 'INR', perYear: 5_400_000 }
    ]);
    expect(control.savingReporting).toBeUndefined();
    expect(f.headline.costReporting).toBeUndefined();
    expect(f.assumptions.find((a) => a.topic === 'currencies')!.explanation).toMatch(
      /never added across them/
    );
  });

  it('converts at the rates entered, states them, and gives no total while a currency lacks a rate', () => {
    const reporting = {
      currency: 'EUR',
      rates: [
        { currency: 'INR', rate: 0.011, asOf: '2026-11-28' },
        { currency: 'USD', rate: 0.92, asOf: '2026-11-28' }
      ]
    };
    const f = buildQuarterReview(r, BUILT_IN_PROFILES, { quarter, reporting });
    const control = f.pipeline.find((p) => p.phase === 'Control')!;
    // 133 000 EUR + 5 400 000 INR × 0.011 = 133 000 + 59 400 = 192 400 EUR (hand-checked).
    expect(control.savingReporting!.amount).toBeCloseTo(192_400, 6);
    expect(control.savings).toHaveLength(2);
    expect(f.reporting!.statement).toBe(
      'Reporting currency EUR, at the rates entered: 1 INR = 0.011 EUR (2026-11-28); 1 USD = 0.92 EUR (2026-11-28).'
    );
    const withoutUsd = buildQuarterReview(r, BUILT_IN_PROFILES, {
      quarter,
      reporting: { currency: 'EUR', rates: [reporting.rates[0]!] }
    });
    expect(withoutUsd.headline.costReporting).toBeUndefined();
    expect(reviewFiguresSchema.safeParse(f).success).toBe(true);
  });
});

describe('projects in the review', () => {
  it('counts open projects only in the pipeline, and shows a project closed in the quarter with its reported result', () => {
    const r = parseDemoPortfolio(demo).records;
    const before = buildQuarterReview(r, BUILT_IN_PROFILES, { quarter: '2026-Q3' });
    // Close one Control project in 2026-08 and cancel another (demo projects, seed-data/demo-portfolio.json).
    const [first, second] = r.projects.filter((p) => p.phase === 'Control');
    const projects = r.projects.map((p) =>
      p.id === first!.id
        ? {
            ...p,
            state: 'closed' as const,
            stateReason: 'gain held for three months',
            achieved: { note: 'bore size within ±4 µm', level: 1.41 },
            history: [{ at: '2026-08-14T10:00:00.000Z', by: 'test', change: 'closed: gain held' }]
          }
        : p.id === second!.id
          ? { ...p, state: 'cancelled' as const, stateReason: 'line closed' }
          : p
    );
    const after = buildQuarterReview({ ...r, projects }, BUILT_IN_PROFILES, { quarter: '2026-Q3' });
    const total = (f: typeof before) => f.pipeline.reduce((a, p) => a + p.projects, 0);
    expect(total(after)).toBe(total(before) - 2);
    const closed = after.control.find((c) => c.projectId === first!.id);
    expect(closed).toMatchObject({
      closed: true,
      reportedResult: 'bore size within ±4 µm',
      reportedLevel: 1.41
    });
    expect(after.control.some((c) => c.projectId === second!.id)).toBe(false);
    expect(reviewFiguresSchema.safeParse(after).success).toBe(true);
    // Closed in another quarter: not in this review's list.
    const later = buildQuarterReview({ ...r, projects }, BUILT_IN_PROFILES, { quarter: '2026-Q2' });
    expect(later.control.some((c) => c.projectId === first!.id)).toBe(false);
  });
});

describe('a frozen review checked against the live figures', () => {
  it('reports a changed figure, not a sum that differs in its last bit', () => {
    const records = parseDemoPortfolio(demo).records;
    const live = buildQuarterReview(records, BUILT_IN_PROFILES, { quarter: '2026-Q3' });
    const frozen = structuredClone(live);
    const cost = frozen.yearAgo.cost[0]!;
    expect(cost.perYear).toBeGreaterThan(0);
    // The same costs summed in another order: one unit in the last place.
    cost.perYear = cost.perYear + cost.perYear * Number.EPSILON;
    expect(cost.perYear).not.toBe(live.yearAgo.cost[0]!.perYear);
    expect(snapshotDifferences(frozen, live)).toEqual([]);
    cost.perYear *= 1.01;
    expect(snapshotDifferences(frozen, live)).toEqual(['headline figures']);
  });
});
