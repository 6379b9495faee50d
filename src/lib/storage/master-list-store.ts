import { isLive, type WriteContext } from '../domain/record-meta';
import { masterListCounts, type MasterListPlan } from '../domain/master-list';
import { masterListRecords } from '../domain/master-list-records';
import type { CapstanDatabase } from './database';

/** New characteristics stored per chunk: each await hands the main thread back (see below). */
const CHUNK = 250;

/**
 * Applies a checked master list (domain/master-list.ts) in one transaction: every new site, process and
 * characteristic, every update and every limit change, or nothing. A plan with bad rows is refused whole.
 * The records are built by domain/master-list-records.ts against the portfolio as it stands inside the
 * transaction.
 */
export async function applyMasterList(db: CapstanDatabase, ctx: WriteContext, plan: MasterListPlan) {
  return db.transaction('rw', [db.sites, db.processes, db.characteristics], async () => {
    const existing = {
      sites: (await db.sites.toArray()).filter(isLive),
      processes: (await db.processes.toArray()).filter(isLive),
      characteristics: (await db.characteristics.toArray()).filter(isLive)
    };
    const records = masterListRecords(plan, existing, ctx);
    await db.sites.bulkPut(records.sites);
    await db.processes.bulkPut(records.processes);
    await db.characteristics.bulkPut(records.changedCharacteristics);
    // New characteristics are checked, stamped and stored a chunk at a time: each await hands the main thread
    // back between chunks, so a list of 20 000 rows never makes one long task (the transaction stays open,
    // since it waits only on its own requests).
    for (const chunk of records.characteristicChunks(CHUNK)) await db.characteristics.bulkPut(chunk);
    return masterListCounts(plan);
  });
}
