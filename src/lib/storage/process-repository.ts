import { type Process } from '../domain/process';
import type { WriteContext } from '../domain/record-meta';
import { liveCountsUnder, removeWithContents, undoRemoval, type Removal } from './cascade-removal';
import type { CapstanDatabase } from './database';
import { archive, RecordRepository, requireLive } from './record-repository';
import { lazyValidation } from './record-validation';

/**
 * Processes: created under a live site; archived (history kept, out of the ranking and the review) or deleted
 * with everything under them, with undo (cascade-removal.ts).
 */
export class ProcessRepository extends RecordRepository<Process> {
  constructor(db: CapstanDatabase, ctx: WriteContext) {
    super(db, ctx, {
      kind: 'Process',
      table: (d) => d.processes,
      validation: lazyValidation(async () => {
        const { parseProcessFields, processFieldsSchema } = await import('../domain/process-schema');
        return { parse: parseProcessFields, fields: Object.keys(processFieldsSchema.shape) };
      }),
      relatedTables: (d) => [d.sites],
      checkInTransaction: async (d, fields) => {
        await requireLive(d.sites, fields.siteId, 'Process', 'siteId', 'Site');
      }
    });
  }

  /** What deleting the process would take along, by kind (for the question before). */
  countsUnder(id: string) {
    return liveCountsUnder(this.db, 'processes', id);
  }

  removeWithContents(id: string): Promise<Removal> {
    return removeWithContents(this.db, this.ctx, 'processes', id);
  }

  undoRemoval(removal: Removal): Promise<void> {
    return undoRemoval(this.db, this.ctx, removal);
  }

  /** Archives (or brings back) a process: its records stay, it leaves (or rejoins) the ranking and the review. */
  async setArchived(id: string, archived: boolean): Promise<Process> {
    return archive(this, id, archived, this.ctx);
  }
}

export function createProcessRepository(db: CapstanDatabase, ctx: WriteContext): ProcessRepository {
  return new ProcessRepository(db, ctx);
}
