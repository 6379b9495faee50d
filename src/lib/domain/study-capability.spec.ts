import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { expectRelative } from '../../../tests/support/reference-data';
import { parseDemoPortfolio } from './demo-portfolio-schema';
import { capabilityOfStudy, figuresOrReason } from './study-capability';

const portfolio = parseDemoPortfolio(demo);
const byId = new Map(portfolio.records.characteristics.map((c) => [c.id, c]));

describe('capability of stored studies', () => {
  it('analyses every demo study without error and states assumptions for each', () => {
    for (const s of portfolio.records.studies) {
      const c = byId.get(s.characteristicId)!;
      const r = capabilityOfStudy(s, c);
      expect(r.assumptions.length, `${c.name} ${s.period}`).toBeGreaterThan(0);
      expect(Number.isFinite(r.zLevel) || r.zLevel === Infinity, `${c.name} ${s.period}`).toBe(true);
      expect(r.yield).toBeGreaterThanOrEqual(0);
      expect(r.yield).toBeLessThanOrEqual(1);
    }
  });

  it('passes limits, subgroups and counts through unchanged', () => {
    const measured = { lsl: 9, usl: 11, dataKind: 'measured' as const };
    const raw = capabilityOfStudy(
      {
        data: {
          kind: 'raw',
          values: [10, 10.2, 9.9, 10.1, 9.8, 10, 10.1, 9.9],
          subgroups: ['a', 'a', 'b', 'b', 'c', 'c', 'd', 'd']
        },
        period: '2026-05'
      },
      measured,
      { model: 'normal' }
    );
    expect(raw.sigmaEstimator).toBe('rbar');
    const summary = capabilityOfStudy(
      { data: { kind: 'summary', n: 50, mean: 10, sd: 0.25 }, period: '2026-05' },
      measured
    );
    expectRelative(summary.ppk, 4 / 3, 1e-12);
    expect(summary.assumptions).toContain('summary only: normality and stability not checked');
    const counted = { dataKind: 'counted' as const };
    expect(
      capabilityOfStudy(
        { data: { kind: 'defectives', units: 200, defectives: 3 }, period: '2026-05' },
        counted
      ).p
    ).toBe(0.015);
    expect(
      capabilityOfStudy(
        { data: { kind: 'defects', units: 100, defects: 4, opportunitiesPerUnit: 4 }, period: '2026-05' },
        counted
      ).dpmo
    ).toBe(10000);
  });

  it("gives the figures of a study, or the analysis's own reason where there can be none (the process page's cell)", () => {
    const measured = { lsl: 9, usl: 11, dataKind: 'measured' as const };
    const study = { data: { kind: 'summary' as const, n: 50, mean: 10, sd: 0.25 }, period: '2026-05' };
    expect(figuresOrReason(study, measured)).toEqual(capabilityOfStudy(study, measured));
    const one = { data: { kind: 'raw' as const, values: [10] }, period: '2026-05' };
    const reason = figuresOrReason(one, measured);
    expect(typeof reason).toBe('string');
    expect(() => capabilityOfStudy(one, measured)).toThrow(reason as string);
  });
});
