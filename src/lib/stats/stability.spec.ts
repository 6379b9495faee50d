import { describe, expect, it } from 'vitest';
import { expectRelative } from '../../../tests/support/reference-data';
import { individualsStability, subgroupStability } from './stability';

/** A series that alternates around 10 with a fixed amplitude: no run, no trend, nothing beyond 3σ. */
const calm = Array.from({ length: 40 }, (_, i) => 10 + (i % 2 === 0 ? 0.5 : -0.5) * (1 + (i % 3) * 0.1));

describe('individuals chart and run rules (Nelson tests 1–3)', () => {
  it('finds nothing in a calm alternating series', () => {
    const r = individualsStability(calm);
    expect(r.stable).toBe(true);
    expect(r.description).toMatch(/No signal/);
  });

  it('flags a point beyond 3σ (test 1) at its index', () => {
    const series = [...calm];
    series[20] = 30;
    const r = individualsStability(series);
    expect(r.signals.some((s) => s.rule === 1 && s.chart === 'location' && s.index === 20)).toBe(true);
    expect(r.stable).toBe(false);
  });

  it('flags nine in a row on one side (test 2) and six in a row rising (test 3)', () => {
    const run = [
      ...calm.slice(0, 20),
      10.6,
      10.7,
      10.62,
      10.75,
      10.61,
      10.7,
      10.66,
      10.72,
      10.64,
      ...calm.slice(0, 10)
    ];
    expect(individualsStability(run).signals.some((s) => s.rule === 2 && s.index === 28)).toBe(true);
    const trend = [...calm.slice(0, 20), 9.6, 9.7, 9.8, 9.9, 10.0, 10.1, ...calm.slice(0, 10)];
    // calm[19] = 9.45 already starts the rise, so the sixth rising point is index 24.
    expect(individualsStability(trend).signals.some((s) => s.rule === 3 && s.index === 24)).toBe(true);
  });

  it('uses MR̄/1.128 for the limits and 3.267·MR̄ for the moving-range chart (Montgomery §6.4)', () => {
    const r = individualsStability([1, 3, 2, 4, 3]);
    const mrBar = (2 + 1 + 2 + 1) / 4;
    expectRelative(r.ucl - r.centre, (3 * mrBar) / 1.128, 1e-12);
    expectRelative(r.spreadUcl, 3.267 * mrBar, 1e-12);
  });
});

describe('subgroup charts', () => {
  it('uses an X̄–R chart up to size 10 and X̄–S above, with limits from the within sigma', () => {
    const groups = Array.from({ length: 10 }, (_, g) =>
      Array.from({ length: 5 }, (_, i) => 10 + ((g * 5 + i) % 7) * 0.1)
    );
    const r = subgroupStability(groups, 0.2);
    expect(r.chart).toBe('xbar-r');
    expectRelative(r.ucl - r.centre, (3 * 0.2) / Math.sqrt(5), 1e-12);
    const big = Array.from({ length: 6 }, (_, g) =>
      Array.from({ length: 12 }, (_, i) => 10 + ((g + i) % 5) * 0.1)
    );
    expect(subgroupStability(big, 0.15).chart).toBe('xbar-s');
  });
});
