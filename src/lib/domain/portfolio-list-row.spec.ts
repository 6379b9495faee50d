import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from './context-profile';
import { parseDemoPortfolio } from './demo-portfolio-schema';
import { filterRows, NO_FILTERS } from './portfolio-filters';
import { listRowOf } from './portfolio-list-row';
import { rankPortfolio } from './portfolio-ranking';

describe('the portfolio list row', () => {
  const records = parseDemoPortfolio(demo).records;
  const rows = rankPortfolio(records, BUILT_IN_PROFILES, { endPeriod: '2026-09', windowMonths: 3 });

  it('carries every figure the list shows, equal to the full row’s', () => {
    expect(rows.length).toBeGreaterThan(10);
    for (const row of rows) {
      const l = listRowOf(row);
      expect(l.process).toEqual({
        id: row.process.id,
        name: row.process.name,
        contextId: row.process.contextId,
        currency: row.process.currency
      });
      expect(l.site).toEqual({ id: row.site.id, name: row.site.name });
      expect(l.measure).toBe(row.profile?.measure);
      for (const key of ['status', 'riskClass', 'yield', 'ppm', 'zLevel', 'zBasis', 'requiredZ'] as const)
        expect(l[key]).toBe(row[key]);
      expect([l.costPerYear, l.trendSlope, l.trend, l.badges]).toEqual([
        row.costPerYear,
        row.trendSlope,
        row.trend,
        row.badges
      ]);
      expect(l.projects).toEqual(row.projects.map((p) => ({ id: p.id, phase: p.phase })));
      const w = row.weakest;
      expect(l.weakest?.name).toBe(w?.characteristic.name);
      expect([l.weakest?.estimate, l.weakest?.bound, l.weakest?.required]).toEqual([
        w?.estimate,
        w?.bound,
        w?.required
      ]);
      expect([l.weakest?.result?.cpk, l.weakest?.result?.ppk]).toEqual([w?.result?.cpk, w?.result?.ppk]);
    }
  });

  it('is filtered by the one rule the worker’s CSV uses, keeping the order', () => {
    const list = rows.map(listRowOf);
    const site = rows[0]!.site.id;
    const filters = { ...NO_FILTERS, site, status: 'short' };
    const full = filterRows(rows, filters);
    expect(full.length).toBeGreaterThan(0);
    expect(full.length).toBeLessThan(rows.length);
    expect(filterRows(list, filters).map((r) => r.process.id)).toEqual(full.map((r) => r.process.id));
    expect(filterRows(list, NO_FILTERS)).toHaveLength(rows.length);
  });
});
