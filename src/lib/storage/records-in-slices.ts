import type { Table } from 'dexie';

/** Records read per request when a whole table is read on the page's thread. */
export const LIST_SLICE = 1000;

/**
 * Every record of a table that `keep` keeps (all without it), read LIST_SLICE records at a time in key order:
 * each slice arrives in a task of its own, so that reading a company's 20 000 processes or characteristics on a
 * page never holds the page in one long task, as one toArray did (165–193 ms a table with the CPU throttled 2×,
 * most of it the database's copy of the records for the page). Each slice is asked for only once the one before
 * has arrived: one loop shared with studiesInParts, which asks for its next part before using this one, left the
 * set-up page's live list blind to a process just added in Chromium (the own-portfolio e2e test failed; tried on
 * 2026-12-04, not kept).
 */
export async function recordsInSlices<T extends { id: string }>(
  table: Table<T, string>,
  keep: (record: T) => boolean = () => true
): Promise<T[]> {
  const kept: T[] = [];
  let after: string | undefined;
  for (;;) {
    const slice = await (after === undefined ? table.orderBy(':id') : table.where(':id').above(after))
      .limit(LIST_SLICE)
      .toArray();
    for (const record of slice) if (keep(record)) kept.push(record);
    if (slice.length < LIST_SLICE) return kept;
    after = slice[slice.length - 1]!.id;
  }
}
