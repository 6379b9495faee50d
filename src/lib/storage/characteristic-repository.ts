import { type Characteristic } from '../domain/characteristic';
import { editableOf, isLive, type WriteContext } from '../domain/record-meta';
import { withLimitChange, type LimitChange } from '../domain/specification-history';
import { liveCountsUnder, removeWithContents, undoRemoval, type Removal } from './cascade-removal';
import type { CapstanDatabase } from './database';
import { archive, RecordNotFoundError, RecordRepository, requireLive } from './record-repository';
import { lazyValidation } from './record-validation';

/**
 * Characteristics: created under a live process; their limits change from a month (earlier months keep theirs);
 * archived, or deleted with their studies, with undo.
 */
export class CharacteristicRepository extends RecordRepository<Characteristic> {
  constructor(db: CapstanDatabase, ctx: WriteContext) {
    super(db, ctx, {
      kind: 'Characteristic',
      table: (d) => d.characteristics,
      validation: lazyValidation(async () => {
        const m = await import('../domain/characteristic-schema');
        return {
          parse: m.parseCharacteristicFields,
          fields: Object.keys(m.characteristicFieldsSchema.shape)
        };
      }),
      relatedTables: (d) => [d.processes],
      checkInTransaction: async (d, fields) => {
        await requireLive(d.processes, fields.processId, 'Characteristic', 'processId', 'Process');
      }
    });
  }

  /** The live characteristics of one process, through the table's processId index (not a read of them all). */
  async listOfProcess(processId: string): Promise<Characteristic[]> {
    return (await this.table.where('processId').equals(processId).toArray()).filter(isLive);
  }

  /**
   * New limits from a month: the months before keep the limits they were judged against. A change from a month
   * that already has one replaces it. Validated like every save (ValidationError names the field).
   */
  async changeLimits(id: string, change: LimitChange, expectedRev?: number): Promise<Characteristic> {
    const c = await this.get(id);
    if (!c) throw new RecordNotFoundError('Characteristic', id);
    return this.update(
      id,
      { ...editableOf(c), limitChanges: withLimitChange(c, change) },
      expectedRev ?? c.rev
    );
  }

  countsUnder(id: string) {
    return liveCountsUnder(this.db, 'characteristics', id);
  }

  removeWithContents(id: string): Promise<Removal> {
    return removeWithContents(this.db, this.ctx, 'characteristics', id);
  }

  undoRemoval(removal: Removal): Promise<void> {
    return undoRemoval(this.db, this.ctx, removal);
  }

  setArchived(id: string, archived: boolean): Promise<Characteristic> {
    return archive(this, id, archived, this.ctx);
  }
}

export function createCharacteristicRepository(
  db: CapstanDatabase,
  ctx: WriteContext
): CharacteristicRepository {
  return new CharacteristicRepository(db, ctx);
}
