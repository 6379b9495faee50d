import { describe, expect, it } from 'vitest';
import { mergedRecordSet, planMerge, settleMerge } from './change-set-merge';
import { summariseConflict } from './conflict-summary';
import { RecordIndex } from './record-index';
import { liveBy, oneMonthPortfolio, writerAt as at } from '../../../tests/support/one-month-scenario';
import { stampUpdate } from './record-meta';
import { mergeRecordSets } from './record-set-merge';
import type { Study } from './study';

/**
 * A month logged on two devices, settled on the site lead's device by keeping the lead's study (the office's is
 * deleted there). The office, not knowing, corrects its study. When the correction arrives, choosing it over
 * the deletion brings the office's study back — beside the lead's, unless the month is asked about too. Found
 * by the multi-device histories test (a seed where the merge refused to write: "two live studies").
 */
function correctionAfterSettling() {
  const { study, withStudies } = oneMonthPortfolio();
  const officeStudy = study('office', 12, '2026-11-03T08:00:00Z');
  const offices = withStudies(officeStudy);
  // The lead's device keeps its own study; the office's is deleted there.
  const leads = withStudies(study('lead', 10, '2026-11-02T08:00:00Z'));
  const settled = mergeRecordSets(leads, offices, 'local', at('lead', '2026-11-04T08:00:00Z')).records;
  // The office corrects its study afterwards.
  const corrected = stampUpdate(
    officeStudy,
    { ...officeStudy, data: { kind: 'summary', n: 30, mean: 11, sd: 1 } } as never,
    at('office', '2026-11-05T08:00:00Z')
  );
  return { settled, correction: withStudies(corrected) };
}

describe('a deleted study corrected elsewhere, in a month that kept another', () => {
  it('asks about the month as well as the study', () => {
    const { settled, correction } = correctionAfterSettling();
    expect(liveBy(settled)).toEqual(['lead']);
    const open = mergeRecordSets(settled, correction);
    expect(open.conflicts.map((c) => [c.type, c.nature]).sort()).toEqual([
      ['record', 'deleted-here'],
      ['same-month', 'same-month']
    ]);
    // This side's study of the month is the one live here.
    const month = open.conflicts.find((c) => c.type === 'same-month')!;
    expect((month.local as Study).enteredBy).toBe('lead');
    expect((month.incoming as Study).enteredBy).toBe('office');
    // The month's question says that it counts only if the correction is taken.
    expect(month.revivable).toBe(month.incoming!.id);
    expect(summariseConflict(month, () => undefined).question).toMatch(
      /The file's study was deleted on this device and corrected in the file: this choice counts only if that correction is taken/
    );
  });

  it('keeps the deletion when the study question says so, whatever the month question says', () => {
    const { settled, correction } = correctionAfterSettling();
    const index = new RecordIndex(settled);
    const plan = planMerge(index, correction);
    const record = plan.conflicts.find((c) => c.type === 'record')!;
    const month = plan.conflicts.find((c) => c.type === 'same-month')!;
    const choices = { perConflict: { [record.key]: 'local' as const, [month.key]: 'incoming' as const } };
    for (const { kind, record: r } of settleMerge(index, plan, choices, at('lead', '2026-11-06T08:00:00Z')))
      index.set(kind, r);
    expect(liveBy(mergedRecordSet(index))).toEqual(['lead']);
  });

  it.each([
    ['local', ['lead']],
    ['incoming', ['office']],
    ['newer', ['office']]
  ] as const)('settled by %s, the month keeps exactly one study', (rule, kept) => {
    const { settled, correction } = correctionAfterSettling();
    const merged = mergeRecordSets(settled, correction, rule, at('lead', '2026-11-06T08:00:00Z')).records;
    expect(liveBy(merged)).toEqual(kept);
  });
});
