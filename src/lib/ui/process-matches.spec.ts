import { describe, expect, it } from 'vitest';
import { groupedBySite, moreMatchesNote, processMatches, SHOWN_PROCESSES } from './process-matches';

const names = Array.from({ length: 250 }, (_, i) => `Line ${i + 1}`);

describe('lists of processes at company size', () => {
  it('shows the first matches in their order and counts them all', () => {
    const all = processMatches(names, '', (n) => n);
    expect(all.shown).toEqual(names.slice(0, SHOWN_PROCESSES));
    expect(all.total).toBe(250);
    expect(moreMatchesNote(all)).toBe(
      'Showing the first 100 of 250 processes; type part of a name to find the others.'
    );
  });

  it('matches what was typed in any case, with spaces around it ignored', () => {
    const some = processMatches(names, '  LINE 2', (n) => n);
    // Line 2, Line 20–29, Line 200–250.
    expect(some.total).toBe(1 + 10 + 51);
    expect(some.shown[0]).toBe('Line 2');
    expect(some.shown.every((n) => n.startsWith('Line 2'))).toBe(true);
    const few = processMatches(names, 'line 25', (n) => n);
    expect(few.shown).toEqual(['Line 25', 'Line 250']);
    expect(moreMatchesNote(few)).toBeUndefined();
  });

  it('groups rows by site id in the order sites first come, even where two sites share a name', () => {
    const row = (site: string, name: string, process: string) => ({ site: { id: site, name }, process });
    const rows = [
      row('a', 'Works', 'p1'),
      row('b', 'Works', 'p2'),
      row('a', 'Works', 'p3'),
      row('c', 'Mill', 'p4')
    ];
    expect(groupedBySite(rows).map((g) => [g.siteId, g.site, g.rows.map((r) => r.process)])).toEqual([
      ['a', 'Works', ['p1', 'p3']],
      ['b', 'Works', ['p2']],
      ['c', 'Mill', ['p4']]
    ]);
  });
});
