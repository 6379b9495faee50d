import type { Characteristic } from '../domain/characteristic';
import { isLive, type WriteContext } from '../domain/record-meta';
import { assertStudyFitsCharacteristic, parseStudyFields, type Study } from '../domain/study';
import { ValidationError } from '../domain/validation-error';
import type { CapstanDatabase } from './database';
import { RecordRepository, requireLive } from './record-repository';

/**
 * Studies. One live study per characteristic and month: a second one for the same month is refused here,
 * because replacing or combining is a decision the person logging must make, never a silent overwrite.
 */
export class StudyRepository extends RecordRepository<Study> {
  constructor(db: CapstanDatabase, ctx: WriteContext) {
    super(db, ctx, {
      kind: 'Study',
      table: (d) => d.studies,
      parse: parseStudyFields,
      relatedTables: (d) => [d.characteristics],
      checkInTransaction: async (d, fields, existingId) => {
        const characteristic = (await requireLive(
          d.characteristics,
          fields.characteristicId,
          'Study',
          'characteristicId',
          'Characteristic'
        )) as Characteristic;
        assertStudyFitsCharacteristic(fields, characteristic);
        const sameMonth = await d.studies
          .where('[characteristicId+period]')
          .equals([fields.characteristicId, fields.period])
          .filter((s) => isLive(s) && s.id !== existingId)
          .first();
        if (sameMonth) {
          throw new ValidationError('Study', [
            {
              field: 'period',
              message: `'${characteristic.name}' already has a study for ${fields.period}; replace or combine that one instead`
            }
          ]);
        }
      }
    });
  }

  /** Live studies of one characteristic, oldest month first. */
  async forCharacteristic(characteristicId: string): Promise<Study[]> {
    const rows = await this.db.studies
      .where('[characteristicId+period]')
      .between([characteristicId, ''], [characteristicId, '\uffff'])
      .toArray();
    return rows.filter(isLive);
  }

  /** Live studies of one month across all characteristics. */
  async forPeriod(period: string): Promise<Study[]> {
    return (await this.db.studies.where('period').equals(period).toArray()).filter(isLive);
  }
}
