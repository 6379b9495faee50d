import type { Characteristic } from '../domain/characteristic';
import { combineStudyData } from '../domain/combine-study-data';
import { futurePeriodProblem } from '../domain/period';
import {
  isLive,
  stampDeleted,
  stampNew,
  stampRestored,
  stampUpdate,
  type Editable,
  type WriteContext
} from '../domain/record-meta';
import { assertStudyFitsCharacteristic, type Study, type StudyFields } from '../domain/study';
import { ValidationError } from '../domain/validation-error';
import type { CapstanDatabase, StudyRevision } from './database';
import { RecordNotFoundError, requireLive, withoutFields } from './record-repository';
import { lazyValidation } from './record-validation';
import { eachStudy, findStudy, putStudies, studiesOf } from './study-shelves';

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
 * Studies are kept on their characteristic's shelf (study-shelves.ts): a study is found by its characteristic,
 * and the methods that take a study's id take its characteristic's as well where the caller knows it.
 */
export class StudyRepository {
  constructor(
    private readonly db: CapstanDatabase,
    private readonly ctx: WriteContext
  ) {}

  private async liveForMonth(
    characteristicId: string,
    period: string,
    exceptId?: string
  ): Promise<Study | undefined> {
    return (await studiesOf(this.db, characteristicId)).find(
      (s) => s.period === period && isLive(s) && s.id !== exceptId
    );
  }

  /** Live studies (tombstones left out), a shelf at a time. */
  async list(): Promise<Study[]> {
    const out: Study[] = [];
    await eachStudy(this.db, (s) => {
      if (isLive(s)) out.push(s);
    });
    return out;
  }

  /** How many live studies there are, a shelf at a time (no long task). */
  async countLive(): Promise<number> {
    let n = 0;
    await eachStudy(this.db, (s) => {
      if (isLive(s)) n += 1;
    });
    return n;
  }

  /** A live study, or undefined (see findStudy: give its characteristic where it is known). */
  async get(id: string, characteristicId?: string): Promise<Study | undefined> {
    const study = await findStudy(this.db, id, characteristicId);
    return study && isLive(study) ? study : undefined;
  }

  /** Logs one new study; a month that already has one is refused (logOne with 'new'). */
  async create(input: unknown): Promise<Study> {
    return (await this.logOne(input, 'new')).study;
  }

  /** Leaves a tombstone; returns it so that the caller can offer an undo. */
  async remove(id: string, characteristicId?: string): Promise<Study> {
    const d = this.db;
    return d.transaction('rw', d.studyShelves, async () => {
      const previous = await findStudy(d, id, characteristicId);
      if (!previous || !isLive(previous)) throw new RecordNotFoundError('Study', id);
      const tombstone = stampDeleted(previous, this.ctx);
      await putStudies(d, [tombstone]);
      return tombstone;
    });
  }

  /** Undoes a deletion as a new revision (refused when the month has a live study again meanwhile). */
  async restore(id: string, characteristicId?: string): Promise<Study> {
    const d = this.db;
    return d.transaction('rw', d.studyShelves, async () => {
      const previous = await findStudy(d, id, characteristicId);
      if (!previous) throw new RecordNotFoundError('Study', id);
      if (isLive(previous)) return previous;
      const restored = stampRestored(previous, this.ctx);
      await putStudies(d, [restored]);
      return restored;
    });
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
      [d.studyShelves, d.characteristics, d.processes, d.sites, d.studyRevisions],
      async () => {
        const outcomes: LogOutcome[] = [];
        for (const fields of parsed) {
          const characteristic = await characteristicFor(d, fields);
          const existing = await this.liveForMonth(fields.characteristicId, fields.period);
          if (!existing) {
            const study = stampNew(editable(fields), this.ctx) as Study;
            await putStudies(d, [study]);
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
          await putStudies(d, [study]);
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
    return d.transaction('rw', [d.studyShelves, d.studyRevisions], async () => {
      const revision = await d.studyRevisions.get(revisionId);
      if (!revision) throw new RecordNotFoundError('Study revision', revisionId);
      const current = await findStudy(d, revision.studyId, revision.study.characteristicId);
      if (!current) throw new RecordNotFoundError('Study', revision.studyId);
      await this.keepRevision(current, 'restored');
      const base = isLive(current) ? current : stampRestored(current, this.ctx);
      const old = revision.study;
      const restored = stampUpdate(withoutFields(base, studyFields), editable(old), this.ctx);
      await putStudies(d, [restored]);
      return restored;
    });
  }

  /** Live studies of one characteristic, oldest month first. */
  async forCharacteristic(characteristicId: string): Promise<Study[]> {
    return (await studiesOf(this.db, characteristicId)).filter(isLive);
  }
}
