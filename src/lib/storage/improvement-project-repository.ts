import { parseImprovementProjectFields, type ImprovementProject } from '../domain/improvement-project';
import type { WriteContext } from '../domain/record-meta';
import type { CapstanDatabase } from './database';
import { RecordRepository, requireLive } from './record-repository';

export function createImprovementProjectRepository(
  db: CapstanDatabase,
  ctx: WriteContext
): RecordRepository<ImprovementProject> {
  return new RecordRepository<ImprovementProject>(db, ctx, {
    kind: 'Improvement project',
    table: (d) => d.projects,
    parse: parseImprovementProjectFields,
    relatedTables: (d) => [d.processes],
    checkInTransaction: async (d, fields) => {
      await requireLive(d.processes, fields.processId, 'Improvement project', 'processId', 'Process');
    }
  });
}
