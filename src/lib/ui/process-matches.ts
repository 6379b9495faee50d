import { countOf } from '../domain/figure-format';

/**
 * Lists of processes (the process page, set-up) at a company's size: thousands of processes drawn as one list was
 * a page no one reads and, at 20 000 processes, tasks of 0.1–0.2 s to draw it. Each list shows the first
 * SHOWN_PROCESSES that match what was typed, in their order, and says how many more there are.
 */
export const SHOWN_PROCESSES = 100;

/** The first SHOWN_PROCESSES items whose text holds `typed` (any case; everything when nothing is typed). */
export function processMatches<T>(
  items: readonly T[],
  typed: string,
  textOf: (item: T) => string
): { shown: T[]; total: number } {
  const wanted = typed.trim().toLowerCase();
  const shown: T[] = [];
  let total = 0;
  for (const item of items) {
    if (wanted !== '' && !textOf(item).toLowerCase().includes(wanted)) continue;
    total += 1;
    if (shown.length < SHOWN_PROCESSES) shown.push(item);
  }
  return { shown, total };
}

/** What a list says when it shows only some of the matches, or undefined when it shows them all. */
export function moreMatchesNote(matches: { shown: readonly unknown[]; total: number }): string | undefined {
  return matches.total > matches.shown.length
    ? `Showing the first ${matches.shown.length} of ${countOf(matches.total, 'process', 'processes')}; type part of a name to find the others.`
    : undefined;
}

/** Rows by site, in the order their sites first come, each site's in their own order (one pass). */
export function groupedBySite<T extends { site: { id: string; name: string } }>(
  rows: readonly T[]
): { siteId: string; site: string; rows: T[] }[] {
  const groups = new Map<string, { siteId: string; site: string; rows: T[] }>();
  for (const row of rows) {
    const group = groups.get(row.site.id);
    if (group) group.rows.push(row);
    else groups.set(row.site.id, { siteId: row.site.id, site: row.site.name, rows: [row] });
  }
  return [...groups.values()];
}
