import { BUILT_IN_PROFILES, type ContextProfile } from '../domain/context-profile';
import { effectiveProfiles, type ContextProfileRecord } from '../domain/context-profile-record';
import { isLive, stampDeleted, stampNew, stampUpdate, type WriteContext } from '../domain/record-meta';
import type { CapstanDatabase } from './database';
import { EditConflictError, withoutFields } from './record-repository';
import { lazyValidation } from './record-validation';

const validation = lazyValidation(async () => {
  const m = await import('../domain/context-profile-record-schema');
  return { parse: m.parseContextProfileFields, fields: Object.keys(m.contextProfileFieldsSchema.shape) };
});

/** Industry-context profiles: the built-ins, with the manager's edits stored as records over them. */
export class ContextProfileRepository {
  constructor(
    private readonly db: CapstanDatabase,
    private readonly ctx: WriteContext
  ) {}

  async effective(): Promise<ContextProfile[]> {
    return effectiveProfiles(BUILT_IN_PROFILES, await this.db.contextProfiles.toArray());
  }

  /** Revision of the stored profile of a context; 0 while the built-in default applies. */
  async revisionOf(contextId: string): Promise<number> {
    const stored = (await this.db.contextProfiles.where('contextId').equals(contextId).toArray()).find(
      isLive
    );
    return stored?.rev ?? 0;
  }

  /**
   * Saves a profile for its context id: a new stored profile, or the next revision of the stored one.
   * `expectedRev` (from `revisionOf` when editing began) refuses to overwrite a change made meanwhile elsewhere.
   */
  async save(input: unknown, expectedRev?: number): Promise<ContextProfileRecord> {
    const { parse, fields: known } = await validation();
    const fields = parse(input);
    return this.db.transaction('rw', this.db.contextProfiles, async () => {
      const existing = (
        await this.db.contextProfiles.where('contextId').equals(fields.contextId).toArray()
      ).find(isLive);
      if (expectedRev !== undefined && (existing?.rev ?? 0) !== expectedRev) {
        throw new EditConflictError('Context profile', fields.label);
      }
      const record = existing
        ? stampUpdate(withoutFields(existing, known), fields, this.ctx)
        : (stampNew(fields, this.ctx) as ContextProfileRecord);
      await this.db.contextProfiles.put(record);
      return record;
    });
  }

  /** Drops the stored edit of a context, so the built-in default applies again. */
  async reset(contextId: string): Promise<void> {
    await this.db.transaction('rw', this.db.contextProfiles, async () => {
      for (const r of (await this.db.contextProfiles.where('contextId').equals(contextId).toArray()).filter(
        isLive
      )) {
        await this.db.contextProfiles.put(stampDeleted(r, this.ctx));
      }
    });
  }
}
