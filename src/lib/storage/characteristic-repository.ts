import { parseCharacteristicFields, type Characteristic } from '../domain/characteristic';
import type { WriteContext } from '../domain/record-meta';
import type { CapstanDatabase } from './database';
import { RecordRepository, requireLive } from './record-repository';

export function createCharacteristicRepository(
  db: CapstanDatabase,
  ctx: WriteContext
): RecordRepository<Characteristic> {
  return new RecordRepository<Characteristic>(db, ctx, {
    kind: 'Characteristic',
    table: (d) => d.characteristics,
    parse: parseCharacteristicFields,
    relatedTables: (d) => [d.processes],
    checkInTransaction: async (d, fields) => {
      await requireLive(d.processes, fields.processId, 'Characteristic', 'processId', 'Process');
    }
  });
}
