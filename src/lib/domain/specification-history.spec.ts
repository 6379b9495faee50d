import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeSummary } from '../stats/analyze-summary';
import { BUILT_IN_PROFILES } from './context-profile';
import { addMonths } from './period';
import { rankPortfolio } from './portfolio-ranking';
import type { Characteristic } from './characteristic';
import type { Process } from './process';
import type { RecordMeta } from './record-meta';
import type { Site } from './site';
import { limitsFor, limitVersionOf, withLimitChange, type LimitChange } from './specification-history';
import type { Study } from './study';
import { capabilityOfStudy } from './study-capability';

const meta = (id: string): RecordMeta => ({ id, createdAt: '', updatedAt: '', rev: 1, deviceId: 'd' });

describe('limit history', () => {
  const c = {
    lsl: 9,
    usl: 11,
    limitChanges: [
      { from: '2026-03', lsl: 9.2, usl: 10.8 },
      { from: '2026-07', lsl: 9.1, target: 10, usl: 10.9 }
    ]
  };
  it('gives each month the limits in force then', () => {
    expect(limitsFor(c, '2026-02')).toEqual({ lsl: 9, usl: 11 });
    expect(limitsFor(c, '2026-03')).toEqual({ lsl: 9.2, usl: 10.8 });
    expect(limitsFor(c, '2026-06')).toEqual({ lsl: 9.2, usl: 10.8 });
    expect(limitsFor(c, '2026-09')).toEqual({ lsl: 9.1, target: 10, usl: 10.9 });
    expect(limitVersionOf(c, '2026-01')).toBe('first');
    expect(limitVersionOf(c, '2026-08')).toBe('2026-07');
  });
  it('replaces a change that takes effect in the same month and keeps month order', () => {
    const next = withLimitChange(c, { from: '2026-03', lsl: 9.3, usl: 10.7 });
    expect(next.map((x) => [x.from, x.lsl])).toEqual([
      ['2026-03', 9.3],
      ['2026-07', 9.1]
    ]);
    expect(withLimitChange(c, { from: '2025-12', lsl: 8, usl: 12 }).map((x) => x.from)).toEqual([
      '2025-12',
      '2026-03',
      '2026-07'
    ]);
  });
});

/**
 * Over random limit histories and random monthly studies: every study's figures use the limits of its own month
 * (checked against an oracle that scans the history by hand), and the ranking's window keeps exactly the months
 * under the limits of its last month, judged with those limits.
 */
// Some 0.7 s alone, more beside the heavier property suites on two cores: a longer limit than the 5 s default, so
// that only a counterexample (fast-check prints its seed) fails it. 3 000 runs of it pass.
describe('every study is judged against its own month’s limits (property)', { timeout: 60_000 }, () => {
  const months = Array.from({ length: 18 }, (_, i) => addMonths('2025-07', i));
  const changeArb = fc.record({
    month: fc.integer({ min: 1, max: 17 }),
    centre: fc.double({ min: 9.5, max: 10.5, noNaN: true }),
    half: fc.double({ min: 0.4, max: 2, noNaN: true })
  });
  it('holds for 200 random histories', () => {
    fc.assert(
      fc.property(
        fc.array(changeArb, { maxLength: 4 }),
        fc.array(fc.double({ min: 9.5, max: 10.5, noNaN: true }), { minLength: 18, maxLength: 18 }),
        fc.integer({ min: 1, max: 12 }),
        (changes, means, window) => {
          let history: LimitChange[] = [];
          for (const ch of changes)
            history = withLimitChange(
              { limitChanges: history },
              { from: months[ch.month]!, lsl: ch.centre - ch.half, usl: ch.centre + ch.half }
            );
          const characteristic: Characteristic = {
            ...meta('c'),
            processId: 'p',
            name: 'Gap',
            unit: 'mm',
            dataKind: 'measured',
            lsl: 8.5,
            usl: 11.5,
            limitChanges: history,
            riskClass: 'standard'
          };
          const studies: Study[] = months.map((period, i) => ({
            ...meta(`s${i}`),
            characteristicId: 'c',
            period,
            data: { kind: 'summary', n: 40, mean: means[i]!, sd: 0.3 },
            enteredBy: ''
          }));
          // Oracle: the last change at or before the month, by a plain scan.
          const oracle = (period: string) => {
            let l = { lsl: 8.5, usl: 11.5 } as { lsl?: number; usl?: number };
            for (const h of history) if (h.from <= period) l = { lsl: h.lsl, usl: h.usl };
            return l;
          };
          for (const s of studies) {
            const figures = capabilityOfStudy(s, characteristic);
            const expected = analyzeSummary(40, (s.data as { mean: number }).mean, 0.3, {
              spec: oracle(s.period)
            });
            expect(figures.ppmTotal).toBe(expected.ppmTotal);
          }
          const end = months[17]!;
          const site: Site = { ...meta('site'), name: 'S', region: '', timeZone: 'UTC' };
          const process: Process = {
            ...meta('p'),
            siteId: 'site',
            name: 'P',
            owner: '',
            contextId: 'vehicle-parts',
            monthlyVolume: 1,
            costPerDefective: 1,
            currency: 'EUR'
          };
          const [row] = rankPortfolio(
            { sites: [site], processes: [process], characteristics: [characteristic], studies, projects: [] },
            BUILT_IN_PROFILES,
            { endPeriod: end, windowMonths: window }
          );
          const first = addMonths(end, -(window - 1));
          const kept = studies
            .filter((s) => s.period >= first && s.period <= end)
            .filter((s) => {
              const a = oracle(s.period);
              const b = oracle(end);
              return a.lsl === b.lsl && a.usl === b.usl;
            });
          const ch = row!.characteristics[0]!;
          expect(ch.months).toBe(kept.length);
          expect(ch.badges.includes('limits changed')).toBe(
            kept.length < studies.filter((s) => s.period >= first && s.period <= end).length
          );
        }
      ),
      { numRuns: 200 }
    );
  });
});
