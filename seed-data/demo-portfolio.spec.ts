import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseDemoPortfolio } from '../src/lib/domain/demo-portfolio-schema';
import { buildDemoPortfolio } from './build-demo-portfolio';

describe('demo portfolio generator', () => {
  const built = buildDemoPortfolio();

  it('is deterministic and matches the committed file (run `npm run seed` after changing the scenario)', () => {
    const committed = readFileSync(new URL('./demo-portfolio.json', import.meta.url), 'utf8');
    expect(`${JSON.stringify(built)}\n`).toBe(committed);
    expect(JSON.stringify(buildDemoPortfolio())).toBe(JSON.stringify(built));
  });

  it('names what each counted characteristic counts, with the opportunities per unit its studies use', () => {
    const { characteristics, studies } = built.records;
    for (const c of characteristics.filter((x) => x.dataKind === 'counted')) {
      const kinds = new Set(studies.filter((s) => s.characteristicId === c.id).map((s) => s.data));
      for (const d of kinds) {
        expect(d.kind).toBe(c.countedAs);
        if (d.kind === 'defects') expect(d.opportunitiesPerUnit).toBe(c.opportunitiesPerUnit);
      }
    }
    expect(characteristics.some((c) => c.opportunitiesPerUnit === 8)).toBe(true);
  });

  it('gives a different portfolio for another seed', () => {
    expect(JSON.stringify(buildDemoPortfolio(7))).not.toBe(JSON.stringify(built));
  });

  it('has the shape the scenario promises and passes the app’s own validation', () => {
    const r = parseDemoPortfolio(built).records;
    expect(r.sites.length).toBeGreaterThanOrEqual(4);
    expect(r.sites.length).toBeLessThanOrEqual(6);
    expect(r.processes.length).toBeGreaterThanOrEqual(30);
    expect(r.processes.length).toBeLessThanOrEqual(60);
    expect(new Set(r.processes.map((p) => p.contextId)).size).toBeGreaterThanOrEqual(4);
    const periods = new Set(r.studies.map((s) => s.period));
    expect(periods.size).toBe(24);
    const kinds = new Set(r.studies.map((s) => s.data.kind));
    expect([...kinds].sort()).toEqual(['defectives', 'defects', 'raw', 'summary']);
    const ids = [...r.sites, ...r.processes, ...r.characteristics, ...r.studies, ...r.projects].map(
      (x) => x.id
    );
    expect(new Set(ids).size).toBe(ids.length);
    expect(r.projects.length).toBeGreaterThanOrEqual(3);
  });
});
