import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Characteristic } from './characteristic';
import { capabilityOfStudy } from './study-capability';
import { windowFiguresOf, windowFiguresOfStudy } from './window-figures';

/**
 * The ranking's short path for merged summaries must give exactly the figures the full analysis gives — the
 * same numbers from the same code (stats/analyze-summary.ts `summaryCore`), not merely close ones.
 */
describe('window figures of a summary', () => {
  const spec = fc.oneof(
    fc.record({ lsl: fc.constant(7), usl: fc.constant(13) }),
    fc.record({ lsl: fc.constant(7) }),
    fc.record({ usl: fc.constant(13), target: fc.constant(10) }),
    fc.record({ lsl: fc.constant(9.9), target: fc.constant(10), usl: fc.constant(10.1) })
  );
  it('equal the full analysis reduced to window figures (property)', () => {
    fc.assert(
      fc.property(
        spec,
        fc.integer({ min: 2, max: 5000 }),
        fc.double({ min: 5, max: 15, noNaN: true }),
        fc.double({ min: 1e-4, max: 5, noNaN: true }),
        fc.option(fc.double({ min: 0, max: 5, noNaN: true })),
        (limits, n, mean, sd, within) => {
          const c = { ...limits, dataKind: 'measured' } as Pick<
            Characteristic,
            'lsl' | 'usl' | 'target' | 'dataKind'
          >;
          const study = { data: { kind: 'summary' as const, n, mean, sd }, period: '2026-05' };
          const sdWithin = within ?? undefined;
          const full = windowFiguresOf(
            capabilityOfStudy(study, c, sdWithin !== undefined ? { sdWithin } : {})
          );
          expect(windowFiguresOfStudy(study, c, sdWithin)).toEqual(full);
          // With the index bounds alone: the same figures and index bounds, no fraction or z-level bound.
          const { fractionUpper, zLevelLower, ...withIndexBounds } = full;
          void [fractionUpper, zLevelLower];
          expect(windowFiguresOfStudy(study, c, sdWithin, 'index')).toEqual(withIndexBounds);
        }
      ),
      { numRuns: 300, seed: 11 }
    );
  }, 30_000);

  it('refuses what the full analysis refuses, with the same message', () => {
    const c = { lsl: 7, usl: 13, dataKind: 'measured' as const };
    const study = { data: { kind: 'summary' as const, n: 1, mean: 10, sd: 1 }, period: '2026-05' };
    expect(() => windowFiguresOfStudy(study, c, undefined)).toThrow(
      /n must be a whole number of at least 2, got 1/
    );
    expect(() => capabilityOfStudy(study, c)).toThrow(/n must be a whole number of at least 2, got 1/);
  });
});

/**
 * Counts take the same short path: the one-sided bound alone (stats/analyze-counts.ts `defectivesBounds`,
 * `defectsBounds`), and exactly the figures the full analysis reduces to.
 */
describe('window figures of a count', () => {
  const c = { dataKind: 'counted' as const };
  const counts = fc
    .integer({ min: 1, max: 2_000_000 })
    .chain((units) =>
      fc.tuple(fc.constant(units), fc.oneof(fc.constant(0), fc.integer({ min: 0, max: units })))
    );
  it('of defectives equal the full analysis reduced to window figures (property)', () => {
    fc.assert(
      fc.property(counts, ([units, defectives]) => {
        const study = { data: { kind: 'defectives' as const, units, defectives }, period: '2026-05' };
        expect(windowFiguresOfStudy(study, c, undefined)).toEqual(
          windowFiguresOf(capabilityOfStudy(study, c))
        );
      }),
      { numRuns: 300, seed: 12 }
    );
  }, 30_000);

  it('of defects equal the full analysis reduced to window figures (property)', () => {
    fc.assert(
      fc.property(counts, fc.integer({ min: 1, max: 12 }), ([units, defects], opportunitiesPerUnit) => {
        const study = {
          data: { kind: 'defects' as const, units, defects, opportunitiesPerUnit },
          period: '2026-05'
        };
        expect(windowFiguresOfStudy(study, c, undefined)).toEqual(
          windowFiguresOf(capabilityOfStudy(study, c))
        );
      }),
      { numRuns: 300, seed: 13 }
    );
  }, 30_000);

  it('refuse what the full analysis refuses, with the same message', () => {
    const cases = [
      { kind: 'defectives' as const, units: 10, defectives: 11 },
      { kind: 'defectives' as const, units: 0, defectives: 0 },
      { kind: 'defects' as const, units: 10, defects: 31, opportunitiesPerUnit: 3 },
      { kind: 'defects' as const, units: 10, defects: 1, opportunitiesPerUnit: 1.5 }
    ];
    for (const data of cases) {
      const study = { data, period: '2026-05' };
      let message = '';
      try {
        capabilityOfStudy(study, c);
      } catch (e) {
        message = (e as Error).message;
      }
      expect(message).not.toBe('');
      expect(() => windowFiguresOfStudy(study, c, undefined)).toThrow(message);
    }
  });
});
