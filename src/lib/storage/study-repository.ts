import type { Characteristic } from '../domain/characteristic';
import { combineStudyData } from '../domain/combine-study-data';
import { futurePeriodProblem } from '../domain/period';
import {
  isLive,
  stampNew,
  stampRestored,
  stampUpdate,
  type Editable,
  type WriteContext
} from '../domain/record-meta';
import { assertStudyFitsCharacteristic, type Study, type StudyFields } from '../domain/study';
import { ValidationError } from '../domain/validation-error';
import type { CapstanDatabase, StudyRevision } from './database';
import { RecordNotFoundError, RecordRepository, requireLive, withoutFields } from './record-repository';
import { lazyValidation } from './record-validation';

const studyValidation = lazyValidation(async () => {
  const { parseStudyFields, studyFieldsSchema } = await import('../domain/study-schema');
  return { parse: parseStudyFields, fields: Object.keys(studyFieldsSchema.shape) };
});

/** What to do when the month already has a study: refuse, replace it, or combine the two. */
export type LogMode = 'new' | 'replace' | 'combine';

export interface LogOutcome {
  study: Study;
  /** The study as it was before, when one was replaced or combined (also kept as a revision). */
  previous?: Study;
  action: 'created' | 'replaced' | 'combined';
}

/**
 * The live characteristic a study names, refusing one that is missing or of the other data kind, and a month
 * that has not begun yet at the characteristic's site (in the site's time zone).
 */
async function characteristicFor(d: CapstanDatabase, fields: StudyFields): Promise<Characteristic> {
  const characteristic = (await requireLive(
    d.characteristics,
    fields.characteristicId,
    'Study',
    'characteristicId',
    'Characteristic'
  )) as Characteristic;
  assertStudyFitsCharacteristic(fields, characteristic);
  const process = await d.processes.get(characteristic.processId);
  const site = process ? await d.sites.get(process.siteId) : undefined;
  const future = futurePeriodProblem(fields.period, site ?? { name: 'this site', timeZone: 'UTC' });
  if (future) throw new ValidationError('Study', [{ field: 'period', message: future }]);
  return characteristic;
}

function editable(fields: StudyFields): Editable<Study> {
  return {
    characteristicId: fields.characteristicId,
    period: fields.period,
    data: fields.data,
    enteredBy: fields.enteredBy,
    ...(fields.note !== undefined ? { note: fields.note } : {})
  };
}

/**
 * Studies. One live study per characteristic and month: a second one for the same month is refused here,
 * because replacing or combining is a decision the person logging must make, never a silent overwrite.
 */
export class StudyRepository extends RecordRepository<Study> {
  constructor(db: CapstanDatabase, ctx: WriteContext) {
    super(db, ctx, {
      kind: 'Study',
      table: (d) => d.studies,
      validation: studyValidation,
      relatedTables: (d) => [d.characteristics, d.processes, d.sites],
      checkInTransaction: async (d, fields, existingId) => {
        const characteristic = await characteristicFor(d, fields);
        const sameMonth = await d.studies
          .where('[characteristicId+period]')
          .equals([fields.characteristicId, fields.period])
          .filter((study) => isLive(study) && study.id !== existingId)
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

  private async liveForMonth(
    characteristicId: string,
    period: string,
    exceptId?: string
  ): Promise<Study | undefined> {
    return this.db.studies
      .where('[characteristicId+period]')
      .equals([characteristicId, period])
      .filter((s) => isLive(s) && s.id !== exceptId)
      .first();
  }

  /** The live study of one characteristic and month, if any. */
  async findForMonth(characteristicId: string, period: string): Promise<Study | undefined> {
    return this.liveForMonth(characteristicId, period);
  }

  /**
   * Logs studies, each for its characteristic and month, in one transaction: every input is validated first,
   * and a refusal of any of them writes nothing. A month that already has a study is replaced or combined as
   * `mode` says (the earlier version is kept as a revision), or refused with mode 'new'.
   */
  async logMany(inputs: readonly unknown[], mode: LogMode): Promise<LogOutcome[]> {
    // Loaded before the transaction: waiting on a module inside one would end it.
    const { parse, fields: studyFields } = await studyValidation();
    const parsed = inputs.map((input, i) => {
      try {
        return parse(input);
      } catch (error) {
        if (error instanceof ValidationError && inputs.length > 1) {
          throw new ValidationError(
            'Study',
            error.problems.map((p) => ({ field: `[${i + 1}].${p.field}`, message: p.message }))
          );
        }
        throw error;
      }
    });
    const d = this.db;
    return d.transaction(
      'rw',
      [d.studies, d.characteristics, d.processes, d.sites, d.studyRevisions],
      async () => {
        const outcomes: LogOutcome[] = [];
        for (const fields of parsed) {
          const characteristic = await characteristicFor(d, fields);
          const existing = await this.liveForMonth(fields.characteristicId, fields.period);
          if (!existing) {
            const study = stampNew(editable(fields), this.ctx) as Study;
            await d.studies.add(study);
            outcomes.push({ study, action: 'created' });
            continue;
          }
          if (mode === 'new') {
            throw new ValidationError('Study', [
              {
                field: 'period',
                message: `'${characteristic.name}' already has a study for ${fields.period}; replace or combine that one instead`
              }
            ]);
          }
          const data = mode === 'combine' ? combineStudyData(existing.data, fields.data) : fields.data;
          const next = parse({ ...editable(fields), data });
          await this.keepRevision(existing, mode === 'combine' ? 'combined' : 'replaced');
          const study = stampUpdate(withoutFields(existing, studyFields), editable(next), this.ctx);
          await d.studies.put(study);
          outcomes.push({ study, previous: existing, action: mode === 'combine' ? 'combined' : 'replaced' });
        }
        return outcomes;
      }
    );
  }

  async logOne(input: unknown, mode: LogMode): Promise<LogOutcome> {
    return (await this.logMany([input], mode))[0] as LogOutcome;
  }

  private async keepRevision(study: Study, reason: StudyRevision['reason']): Promise<void> {
    await this.db.studyRevisions.add({
      id: this.ctx.newId(),
      studyId: study.id,
      savedAt: this.ctx.now().toISOString(),
      reason,
      study
    });
  }

  /** Earlier versions of a study, newest first. */
  async revisionsOf(studyId: string): Promise<StudyRevision[]> {
    const rows = await this.db.studyRevisions.where('studyId').equals(studyId).toArray();
    return rows.sort((a, b) => b.savedAt.localeCompare(a.savedAt) || b.study.rev - a.study.rev);
  }

  /** Puts an earlier version back as a new revision; the version it replaces is kept in turn. */
  async restoreRevision(revisionId: string): Promise<Study> {
    const d = this.db;
    const { fields: studyFields } = await studyValidation();
    return d.transaction('rw', [d.studies, d.studyRevisions], async () => {
      const revision = await d.studyRevisions.get(revisionId);
      if (!revision) throw new RecordNotFoundError('Study revision', revisionId);
      const current = await d.studies.get(revision.studyId);
      if (!current) throw new RecordNotFoundError('Study', revision.studyId);
      await this.keepRevision(current, 'restored');
      const base = isLive(current) ? current : stampRestored(current, this.ctx);
      const old = revision.study;
      const restored = stampUpdate(withoutFields(base, studyFields), editable(old), this.ctx);
      await d.studies.put(restored);
      return restored;
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
