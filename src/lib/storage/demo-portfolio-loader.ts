import { datedFromToday, DEMO_SITE_IDS } from '../domain/demo-portfolio';
import type { RecordKind } from '../domain/record-kinds';
import { isLive, type WriteContext } from '../domain/record-meta';
import { cascadeTables, removeWithContents } from './cascade-removal';
import type { CapstanDatabase } from './database';
import { anyLiveStudy, putStudies } from './study-shelves';

export interface DemoLoadResult {
  sites: number;
  processes: number;
  characteristics: number;
  studies: number;
  projects: number;
}

/** True when the database holds no live record in any synchronised table. */
export async function isPortfolioEmpty(db: CapstanDatabase): Promise<boolean> {
  for (const table of [db.sites, db.processes, db.characteristics, db.projects]) {
    const anyLive = await (table as typeof db.sites).filter(isLive).first();
    if (anyLive) return false;
  }
  return !(await anyLiveStudy(db));
}

/** True when a demo site is live here (loaded on this device or received in a file). */
export async function isDemoPresent(db: CapstanDatabase): Promise<boolean> {
  return (await db.sites.bulkGet([...DEMO_SITE_IDS])).some((s) => s !== undefined && isLive(s));
}

/**
 * Loads the demo portfolio in one transaction: all records or none, dated from today (see `datedFromToday`).
 * It may sit beside the user's own records — a banner marks it and one action removes it — but it loads only
 * once: a database that holds any demo site, live or removed, is refused, so that a removal is never silently
 * overwritten by fresh copies with the same ids.
 */
export async function loadDemoPortfolio(
  db: CapstanDatabase,
  file: unknown,
  nowMs: number = Date.now()
): Promise<DemoLoadResult> {
  // The file's check is loaded with it (zod stays off pages that only read).
  const { parseDemoPortfolio } = await import('../domain/demo-portfolio-schema');
  const demo = datedFromToday(parseDemoPortfolio(file), nowMs);
  const r = demo.records;
  await db.transaction(
    'rw',
    [db.sites, db.processes, db.characteristics, db.studyShelves, db.projects],
    async () => {
      const held = (await db.sites.bulkGet([...DEMO_SITE_IDS])).filter((s) => s !== undefined);
      if (held.some(isLive)) throw new Error('The demo portfolio is already loaded on this device');
      if (held.length > 0)
        throw new Error(
          'The demo portfolio was removed from this portfolio; its records stay removed on every device, so it cannot be loaded again here'
        );
      await db.sites.bulkPut(r.sites);
      await db.processes.bulkPut(r.processes);
      await db.characteristics.bulkPut(r.characteristics);
      await putStudies(db, r.studies);
      await db.projects.bulkPut(r.projects);
    }
  );
  return {
    sites: r.sites.length,
    processes: r.processes.length,
    characteristics: r.characteristics.length,
    studies: r.studies.length,
    projects: r.projects.length
  };
}

/**
 * Removes the demo in one transaction: each demo site with everything under it (cascade-removal.ts), so no
 * record is left without its parent. Records outside the demo sites — the user's own — are not touched; records
 * the user added under a demo site go with it, and are counted in the result.
 */
export async function removeDemoPortfolio(
  db: CapstanDatabase,
  ctx: WriteContext
): Promise<Partial<Record<RecordKind, number>>> {
  return db.transaction('rw', cascadeTables(db), async () => {
    const counts: Partial<Record<RecordKind, number>> = {};
    for (const id of DEMO_SITE_IDS) {
      const site = await db.sites.get(id);
      if (!site || !isLive(site)) continue;
      const removal = await removeWithContents(db, ctx, 'sites', id);
      counts.sites = (counts.sites ?? 0) + 1;
      for (const [k, n] of Object.entries(removal.counts) as [RecordKind, number][])
        counts[k] = (counts[k] ?? 0) + n;
    }
    return counts;
  });
}
