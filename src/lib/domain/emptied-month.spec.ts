import { describe, expect, it } from 'vitest';
import { summariseConflict } from './conflict-summary';
import { liveBy, oneMonthPortfolio, writerAt as at } from '../../../tests/support/one-month-scenario';
import { mergeRecordSets } from './record-set-merge';

/**
 * Two devices meet one month logged twice (by site leads A and B) and settle it by different choices: X keeps
 * A's study, Y keeps B's. Each deleted the other's study, so when X and Y meet, each deletion supersedes the
 * other side's live study. Merging must ask which study the month keeps, not leave it empty.
 */
function twoSettlements() {
  const { study, withStudies } = oneMonthPortfolio();
  const a = withStudies(study('lead-a', 10, '2026-11-02T08:00:00Z'));
  const b = withStudies(study('lead-b', 12, '2026-11-03T08:00:00Z'));
  const x = mergeRecordSets(a, b, 'local', at('x', '2026-11-04T08:00:00Z')).records;
  const y = mergeRecordSets(b, a, 'local', at('y', '2026-11-05T08:00:00Z')).records;
  return { x, y };
}

describe('a month each side settled differently', () => {
  it('is a conflict when the two meet, never an empty month', () => {
    const { x, y } = twoSettlements();
    expect([liveBy(x), liveBy(y)]).toEqual([['lead-a'], ['lead-b']]);
    const open = mergeRecordSets(x, y);
    expect(open.conflicts.map((c) => [c.type, c.nature])).toEqual([['same-month', 'emptied-month']]);
    const summary = summariseConflict(open.conflicts[0]!, () => undefined);
    expect(summary.question).toMatch(/would leave the month with none/);
    expect(summary.choices.map((c) => c.value)).toEqual(['local', 'incoming', 'combine']);
  });

  it.each([
    ['local', ['lead-a']],
    ['incoming', ['lead-b']],
    ['newer', ['lead-b']]
  ] as const)('settled by %s, the month keeps exactly one study', (rule, kept) => {
    const { x, y } = twoSettlements();
    const merged = mergeRecordSets(x, y, rule, at('x', '2026-11-06T08:00:00Z')).records;
    expect(liveBy(merged)).toEqual(kept);
    // The other side then agrees: merging the result back changes nothing and asks nothing.
    const back = mergeRecordSets(y, merged, undefined, at('y', '2026-11-07T08:00:00Z'));
    expect(back.conflicts).toEqual([]);
    expect(liveBy(back.records)).toEqual(kept);
  });
});
