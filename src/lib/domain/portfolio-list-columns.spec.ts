import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from './context-profile';
import { parseDemoPortfolio } from './demo-portfolio-schema';
import { NO_FILTERS, type PortfolioFilters } from './portfolio-filters';
import { filteredEntries, filteredRows, listRowAt, listSummary } from './portfolio-list-columns';
import { listColumnsOf } from './portfolio-list-of-ranking';
import { rankedPortfolio, rankPortfolio, type ProcessRow } from './portfolio-ranking';

/** The filters' rule written out plainly over full rows, to check the columns' one against. */
function passesPlainly(row: ProcessRow, f: PortfolioFilters): boolean {
  if (f.site && row.site.id !== f.site) return false;
  if (f.context && row.process.contextId !== f.context) return false;
  if (f.risk && row.riskClass !== f.risk) return false;
  if (f.status && row.status !== f.status) return false;
  if (f.project === 'with' && row.projects.length === 0) return false;
  if (f.project === 'without' && row.projects.length > 0) return false;
  return true;
}

describe('the portfolio list columns', () => {
  const records = parseDemoPortfolio(demo).records;
  const options = { endPeriod: '2026-09', windowMonths: 3, trendMonths: 0 };
  const rows = rankPortfolio(records, BUILT_IN_PROFILES, options);
  const list = listColumnsOf(rankedPortfolio(records, BUILT_IN_PROFILES, options));

  it('carries every figure the list shows, equal to the full row’s, in the ranking’s order', () => {
    expect(rows.length).toBeGreaterThan(10);
    expect(list.count).toBe(rows.length);
    rows.forEach((row, i) => {
      const l = listRowAt(list, i);
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
      expect([l.costPerYear, l.badges]).toEqual([row.costPerYear, row.badges]);
      expect(l.trend).toBeUndefined();
      expect(l.projects).toEqual(row.projects.map((p) => ({ id: p.id, phase: p.phase })));
      const w = row.weakest;
      expect(l.weakest?.name).toBe(w?.characteristic.name);
      expect([l.weakest?.estimate, l.weakest?.bound, l.weakest?.required, l.weakest?.requiredZ]).toEqual([
        w?.estimate,
        w?.bound,
        w?.required,
        w?.requiredZ
      ]);
      expect([l.weakest?.result?.cpk, l.weakest?.result?.ppk]).toEqual([w?.result?.cpk, w?.result?.ppk]);
    });
  });

  it('is filtered by the filters’ rule, keeping the order', () => {
    const site = rows[0]!.site.id;
    const choices: PortfolioFilters[] = [
      NO_FILTERS,
      { ...NO_FILTERS, site, status: 'short' },
      { ...NO_FILTERS, project: 'with' },
      { ...NO_FILTERS, project: 'without', risk: 'safety' },
      { ...NO_FILTERS, context: rows[1]!.process.contextId }
    ];
    for (const filters of choices) {
      const plain = rows.filter((r) => passesPlainly(r, filters)).map((r) => r.process.id);
      expect(Array.from(filteredEntries(list, filters), (i) => list.processIds[i])).toEqual(plain);
      const shown = filteredRows(list, filters);
      expect(shown.length).toBe(plain.length);
      expect(shown.slice(0, 3).map((r) => r.process.id)).toEqual(plain.slice(0, 3));
    }
    expect(filteredEntries(list, { ...NO_FILTERS, site, status: 'short' }).length).toBeLessThan(rows.length);
  });

  it('sums up the sites, contexts and the two counts the page states', () => {
    const summary = listSummary(list);
    expect(summary.sites.map((s) => s.id).sort()).toEqual([...new Set(rows.map((r) => r.site.id))].sort());
    expect(summary.contexts).toEqual([...new Set(rows.map((r) => r.process.contextId))].sort());
    expect(summary.shortWithoutProject).toBe(
      rows.filter((r) => r.status === 'short' && r.projects.length === 0).length
    );
    expect(summary.projectsOnMeeting).toBe(
      rows.filter((r) => r.status === 'meets, shown' && r.projects.length > 0).length
    );
  });
});
