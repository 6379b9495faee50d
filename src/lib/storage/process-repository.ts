import { parseProcessFields, type Process } from '../domain/process';
import type { WriteContext } from '../domain/record-meta';
import type { CapstanDatabase } from './database';
import { RecordRepository, requireLive } from './record-repository';

export function createProcessRepository(db: CapstanDatabase, ctx: WriteContext): RecordRepository<Process> {
  return new RecordRepository<Process>(db, ctx, {
    kind: 'Process',
    table: (d) => d.processes,
    parse: parseProcessFields,
    relatedTables: (d) => [d.sites],
    checkInTransaction: async (d, fields) => {
      await requireLive(d.sites, fields.siteId, 'Process', 'siteId', 'Site');
    }
  });
}
