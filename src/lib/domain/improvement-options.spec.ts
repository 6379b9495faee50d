import { describe, expect, it } from 'vitest';
import { normalSf } from '../stats/normal-distribution';
import { BUILT_IN_PROFILES } from './context-profile';
import { improvementOptions } from './improvement-options';
import { rankPortfolio } from './portfolio-ranking';
import type { RecordMeta } from './record-meta';

const meta = (id: string): RecordMeta => ({ id, createdAt: '', updatedAt: '', rev: 1, deviceId: 'd' });

describe('centring, less spread, or both', () => {
  // Vehicle parts, standard risk: Cpk ≥ 1.33, i.e. zMin ≥ 3.99. Limits 7–13, target 10; mean 11, sd 0.7:
  // Cpk = (13 − 11)/(3·0.7) = 0.952 (short); centred, Cp = 6/(6·0.7) = 1.43 (meets).
  const rows = rankPortfolio(
    {
      sites: [{ ...meta('s'), name: 'S', region: '', timeZone: 'UTC' }],
      processes: [
        {
          ...meta('p'),
          siteId: 's',
          name: 'P',
          owner: '',
          contextId: 'vehicle-parts',
          monthlyVolume: 10_000,
          costPerDefective: 5,
          currency: 'EUR'
        }
      ],
      characteristics: [
        {
          ...meta('c'),
          processId: 'p',
          name: 'Gap',
          unit: 'mm',
          dataKind: 'measured',
          lsl: 7,
          target: 10,
          usl: 13,
          riskClass: 'standard'
        }
      ],
      studies: [
        {
          ...meta('x'),
          characteristicId: 'c',
          period: '2026-05',
          data: { kind: 'summary', n: 200, mean: 11, sd: 0.7 },
          enteredBy: ''
        }
      ],
      projects: []
    },
    BUILT_IN_PROFILES,
    { endPeriod: '2026-05', windowMonths: 1 }
  );
  const row = rows[0]!;
  const options = improvementOptions(row, row.characteristics[0]!, '2026-05')!;
  const by = Object.fromEntries(options.map((o) => [o.name, o]));

  it('centring alone meets it here; less spread alone needs sd = 2/3.99 with the mean where it is', () => {
    expect(by.now!.meets).toBe(false);
    expect(by.centring!.meets).toBe(true);
    expect(by.centring!.mean).toBe(10);
    expect(by.spread!.sd).toBeCloseTo(2 / (3 * 1.33), 6);
    expect(by.spread!.meets).toBe(true);
    expect(by.both!.sd).toBeCloseTo(3 / (3 * 1.33), 6);
  });

  it('states each option in ppm and yearly cost: the cost is the fraction × volume × 12 × cost', () => {
    const ppmCentred = 2 * normalSf(3 / 0.7) * 1e6;
    expect(by.centring!.ppm).toBeCloseTo(ppmCentred, 6);
    expect(by.centring!.costPerYear).toBeCloseTo((ppmCentred / 1e6) * 10_000 * 12 * 5, 6);
    expect(by.now!.costPerYear).toBeCloseTo(row.costPerYear!, 6);
  });
});
