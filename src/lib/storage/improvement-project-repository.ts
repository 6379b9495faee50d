import {
  projectChanges,
  type ImprovementProject,
  type ImprovementProjectFields
} from '../domain/improvement-project';
import { editableOf, type WriteContext } from '../domain/record-meta';
import type { CapstanDatabase } from './database';
import { RecordNotFoundError, RecordRepository, requireLive } from './record-repository';
import { lazyValidation } from './record-validation';

const MAX_HISTORY = 500;

/**
 * Improvement projects. Every save through `save` adds to the project's history what changed, when and by whom,
 * and dates the entry into a new phase; the history travels with the record.
 */
export class ProjectRepository extends RecordRepository<ImprovementProject> {
  constructor(db: CapstanDatabase, ctx: WriteContext) {
    super(db, ctx, {
      kind: 'Improvement project',
      table: (d) => d.projects,
      validation: lazyValidation(async () => {
        const m = await import('../domain/improvement-project-schema');
        return {
          parse: m.parseImprovementProjectFields,
          fields: Object.keys(m.improvementProjectFieldsSchema.shape)
        };
      }),
      relatedTables: (d) => [d.processes],
      checkInTransaction: async (d, fields) => {
        await requireLive(d.processes, fields.processId, 'Improvement project', 'processId', 'Process');
      }
    });
  }

  /**
   * Starts a project: its first phase dated from its start, and a first history line (with `note`, e.g. the
   * approach chosen and what it was expected to give).
   */
  async start(input: ImprovementProjectFields, by: string, note?: string): Promise<ImprovementProject> {
    return this.create({
      ...input,
      phaseDates: { ...input.phaseDates, [input.phase]: input.phaseDates?.[input.phase] ?? input.startDate },
      history: [
        {
          at: this.ctx.now().toISOString(),
          by,
          change: `started in ${input.phase}${note ? `; ${note}` : ''}`.slice(0, 500)
        }
      ]
    });
  }

  /** Saves an edit with its history line; refused (EditConflictError) when the project changed since `expectedRev`. */
  async save(
    id: string,
    input: ImprovementProjectFields,
    by: string,
    expectedRev?: number
  ): Promise<ImprovementProject> {
    const before = await this.get(id);
    if (!before) throw new RecordNotFoundError('Improvement project', id);
    const fields = (await this.spec.validation()).parse(input);
    const changes = projectChanges(editableOf(before), fields);
    const today = this.ctx.now().toISOString().slice(0, 10);
    const phaseDates = { ...before.phaseDates, ...fields.phaseDates };
    if (fields.phase !== before.phase && !phaseDates[fields.phase]) phaseDates[fields.phase] = today;
    const history = [
      ...(before.history ?? []),
      ...(changes.length ? [{ at: this.ctx.now().toISOString(), by, change: changes.join('; ') }] : [])
    ].slice(-MAX_HISTORY);
    return this.update(id, { ...fields, phaseDates, history }, expectedRev);
  }
}

export function createImprovementProjectRepository(
  db: CapstanDatabase,
  ctx: WriteContext
): ProjectRepository {
  return new ProjectRepository(db, ctx);
}
