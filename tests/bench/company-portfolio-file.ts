/**
 * A company's portfolio as an exchange file, the way a real one arrives: 50 sites, N processes with one
 * characteristic each (a third counted), 36 months of monthly studies (summaries or counts), a project on every
 * tenth process — every record stamped as the app stamps it, under a random (seeded) UUID, and each list in id
 * order as an export writes it. Used by the browser rows (import, then the pages) and the command-line rows
 * (`rank`, `check`).
 */
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { PROJECT_PHASES } from '../../src/lib/domain/improvement-project';
import { addMonths } from '../../src/lib/domain/period';
import { editableOf, stampNew, stampUpdate, type WriteContext } from '../../src/lib/domain/record-meta';
import { changeSetOf, encodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { inIdOrder, seededIds } from './seeded-ids';

export const COMPANY_LAST_PERIOD = '2026-10';

/**
 * `revised`: every study as edited once more on the exporting device (a new version of the same record, its
 * version vector one further), as a site's file arrives after its lead corrected each month.
 */
export async function companyPortfolioFile(
  processCount: number,
  months = 36,
  options: { revised?: boolean } = {}
): Promise<Uint8Array> {
  const ctx: WriteContext = {
    deviceId: 'bench-device',
    now: () => new Date('2026-11-15T00:00:00Z'),
    newId: seededIds(20261115)
  };
  let s = 12345;
  const u = () => (s = (s * 48271) % 2147483647) / 2147483647;
  const sites = Array.from({ length: 50 }, (_, i) =>
    stampNew({ name: `Works ${i + 1}`, region: `Region ${(i % 5) + 1}`, timeZone: 'UTC' }, ctx)
  );
  const processes = Array.from({ length: processCount }, (_, p) =>
    stampNew(
      {
        siteId: sites[p % sites.length]!.id,
        name: `Line ${p + 1}`,
        owner: '',
        contextId: BUILT_IN_PROFILES[p % BUILT_IN_PROFILES.length]!.id,
        monthlyVolume: 1000 + p,
        costPerDefective: 5,
        currency: 'EUR'
      },
      ctx
    )
  );
  const characteristics = processes.map((p, i) =>
    stampNew(
      {
        processId: p.id,
        name: i % 3 === 0 ? 'Defective units' : 'Bore diameter',
        unit: i % 3 === 0 ? '' : 'mm',
        dataKind: i % 3 === 0 ? ('counted' as const) : ('measured' as const),
        riskClass: i % 7 === 0 ? ('safety' as const) : ('standard' as const),
        ...(i % 3 === 0 ? {} : { lsl: 7, usl: 13 })
      },
      ctx
    )
  );
  const first = addMonths(COMPANY_LAST_PERIOD, -(months - 1));
  const firstStudies = characteristics.flatMap((c, i) =>
    Array.from({ length: months }, (_, m) =>
      stampNew(
        {
          characteristicId: c.id,
          period: addMonths(first, m),
          enteredBy: 'bench',
          data:
            i % 3 === 0
              ? { kind: 'defectives' as const, units: 2000, defectives: Math.floor(u() * 20) }
              : { kind: 'summary' as const, n: 50, mean: 10 + (u() - 0.5), sd: 0.4 + u() * 0.4 }
        },
        ctx
      )
    )
  );
  const studies = options.revised
    ? firstStudies.map((study) =>
        stampUpdate(study, { ...editableOf(study), enteredBy: 'bench, revised' }, ctx)
      )
    : firstStudies;
  const projects = processes
    .filter((_, i) => i % 10 === 0)
    .map((p, i) =>
      stampNew(
        {
          processId: p.id,
          title: `Project ${i + 1}`,
          phase: PROJECT_PHASES[i % PROJECT_PHASES.length]!,
          owner: '',
          startDate: '2025-04-01',
          expectedAnnualSaving: 10_000
        },
        ctx
      )
    );
  const header = {
    appVersion: 'bench',
    exportedBy: { deviceId: 'bench-device', deviceName: 'bench' },
    exportedAt: '2026-11-15T00:00:00.000Z',
    scope: { kind: 'everything' as const }
  };
  return encodeExchangeFile(
    changeSetOf(header, {
      contextProfiles: [],
      // Each list in id order, as an export reads them from IndexedDB.
      sites: inIdOrder(sites),
      processes: inIdOrder(processes),
      characteristics: inIdOrder(characteristics),
      studies: inIdOrder(studies),
      projects: inIdOrder(projects),
      reviews: []
    })
  );
}
