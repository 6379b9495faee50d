import { emptyRecords, type RecordsByKind } from '../../src/lib/domain/record-kinds';
import { isLive, stampNew, type WriteContext } from '../../src/lib/domain/record-meta';
import type { Study } from '../../src/lib/domain/study';

/**
 * The smallest portfolio a same-month merge question needs: one site, one process, one measured characteristic,
 * and studies of its month 2026-10 written by named devices at given times. Shared by the merge specs that replay
 * how two devices settled one month.
 */
export const writerAt = (deviceId: string, iso: string): WriteContext => ({
  deviceId,
  now: () => new Date(iso),
  newId: () => `${deviceId}-${Math.random().toString(36).slice(2)}`
});

export function oneMonthPortfolio() {
  const office = writerAt('office', '2026-11-01T08:00:00Z');
  const site = stampNew({ name: 'North Ridge', timeZone: 'UTC' }, office);
  const process = stampNew({ siteId: site.id, name: 'Press line' }, office);
  const ch = stampNew({ processId: process.id, name: 'Bore diameter' }, office);
  const base = { ...emptyRecords(), sites: [site], processes: [process], characteristics: [ch] };
  /** A study of the month by `who` (also the writing device), written at `iso`. */
  const study = (who: string, mean: number, iso: string) =>
    stampNew(
      {
        characteristicId: ch.id,
        period: '2026-10',
        data: { kind: 'summary' as const, n: 30, mean, sd: 1 },
        enteredBy: who
      },
      writerAt(who, iso)
    ) as unknown as Study;
  /** The portfolio holding these studies. */
  const withStudies = (...studies: Study[]) => ({ ...base, studies }) as unknown as RecordsByKind;
  return { study, withStudies };
}

/** Who entered each live study, sorted: what a month keeps after a merge. */
export const liveBy = (r: RecordsByKind) =>
  r.studies
    .filter(isLive)
    .map((s) => s.enteredBy)
    .sort();
