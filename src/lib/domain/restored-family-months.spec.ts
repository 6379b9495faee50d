import { describe, expect, it } from 'vitest';
import { liveBy, oneMonthPortfolio, writerAt as at } from '../../../tests/support/one-month-scenario';
import { isLive, stampDeleted, stampUpdate } from './record-meta';
import type { RecordsByKind } from './record-kinds';
import { mergeRecordSets } from './record-set-merge';
import { liveMonthClashes } from './study-month';
import type { Study } from './study';

/**
 * A site deleted with its contents on two devices, each of which held its own study of one month: the file
 * that carries the deletion then holds two deleted studies of that month. A third device, whose newer edit
 * keeps the site, brings the family back — and bringing back both studies broke "one live study per
 * characteristic and month": the merge refused every file from that device ("two live studies"), so the
 * devices could never agree again. Found by the multi-device histories under seed 20261205.
 */
function deletedTwice() {
  const { study, withStudies } = oneMonthPortfolio();
  const office = study('office', 12, '2026-11-02T08:00:00Z');
  const lead = study('lead', 10, '2026-11-03T08:00:00Z');
  const removal = at('lead', '2026-11-04T08:00:00Z');
  // As the site's removal leaves them on the device that merged both: the site and both studies deleted at
  // the removal's instant.
  const base = withStudies(office, lead);
  const removed = {
    ...base,
    sites: base.sites.map((s) => stampDeleted(s, removal)),
    processes: base.processes.map((p) => stampDeleted(p, removal)),
    characteristics: base.characteristics.map((c) => stampDeleted(c, removal)),
    studies: base.studies.map((s) => stampDeleted(s, removal))
  } as RecordsByKind;
  return { study, withStudies, removed };
}

describe('a family brought back that holds two deleted studies of one month', () => {
  it('brings back one of them, the newest edit, where the month holds no live study', () => {
    const { withStudies, removed } = deletedTwice();
    // The third device renamed the site after the removal: under "newer edit wins" the site stays.
    const kept = withStudies();
    const renamed = {
      ...kept,
      sites: kept.sites.map((s) =>
        stampUpdate(s, { ...s, name: 'North Ridge works' } as never, at('lead-2', '2026-11-05T08:00:00Z'))
      )
    } as RecordsByKind;
    const merged = mergeRecordSets(renamed, removed, 'newer', at('lead-2', '2026-11-06T08:00:00Z')).records;
    expect(merged.sites.every(isLive)).toBe(true);
    expect(liveMonthClashes(merged.studies as Study[])).toEqual([]);
    // Both deletions were written at one instant by one device, a tie: the lower id (`lead-…`) comes back.
    expect(liveBy(merged)).toEqual(['lead']);
    // The device that sent the deletion, receiving the merged records back, ends with the same month.
    const back = mergeRecordSets(removed, merged, 'newer', at('lead', '2026-11-07T08:00:00Z')).records;
    expect(liveBy(back)).toEqual(liveBy(merged));
  });

  it('brings back none where the month holds a live study already', () => {
    const { study, withStudies, removed } = deletedTwice();
    // The third device logged its own study of the month after the removal: it keeps the site and the month.
    const own = withStudies(study('lead-2', 11, '2026-11-05T08:00:00Z'));
    const merged = mergeRecordSets(own, removed, 'newer', at('lead-2', '2026-11-06T08:00:00Z')).records;
    expect(merged.sites.every(isLive)).toBe(true);
    expect(liveBy(merged)).toEqual(['lead-2']);
    const back = mergeRecordSets(removed, merged, 'newer', at('lead', '2026-11-07T08:00:00Z')).records;
    expect(liveBy(back)).toEqual(['lead-2']);
  });
});
