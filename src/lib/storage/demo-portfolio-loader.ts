import { datedFromToday, parseDemoPortfolio } from '../domain/demo-portfolio';
import { isLive } from '../domain/record-meta';
import type { CapstanDatabase } from './database';

export interface DemoLoadResult {
  sites: number;
  processes: number;
  characteristics: number;
  studies: number;
  projects: number;
}

/** True when the database holds no live record in any synchronised table. */
export async function isPortfolioEmpty(db: CapstanDatabase): Promise<boolean> {
  for (const table of [db.sites, db.processes, db.characteristics, db.studies, db.projects]) {
    const anyLive = await (table as typeof db.sites).filter(isLive).first();
    if (anyLive) return false;
  }
  return true;
}

/**
 * Loads the demo portfolio into an empty database in one transaction: all records or none, dated from today
 * (see `datedFromToday`). Refuses a database that already holds data, so that a demo can never mix into real
 * studies.
 */
export async function loadDemoPortfolio(
  db: CapstanDatabase,
  file: unknown,
  nowMs: number = Date.now()
): Promise<DemoLoadResult> {
  const demo = datedFromToday(parseDemoPortfolio(file), nowMs);
  const r = demo.records;
  await db.transaction(
    'rw',
    [db.sites, db.processes, db.characteristics, db.studies, db.projects],
    async () => {
      if (!(await isPortfolioEmpty(db))) {
        throw new Error(
          'The demo portfolio loads only into an empty database; this one already holds records'
        );
      }
      await db.sites.bulkPut(r.sites);
      await db.processes.bulkPut(r.processes);
      await db.characteristics.bulkPut(r.characteristics);
      await db.studies.bulkPut(r.studies);
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
