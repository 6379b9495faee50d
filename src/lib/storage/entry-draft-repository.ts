import type { CapstanDatabase, EntryDraft } from './database';

/**
 * Drafts of entry forms, one per characteristic and month, written while a person types so that a closed tab,
 * a crash or a sleeping tablet loses nothing. Device-local; cleared when the study is saved or the draft dropped.
 */
export class EntryDraftRepository {
  constructor(private readonly db: CapstanDatabase) {}

  static keyOf(characteristicId: string, period: string): string {
    return `${characteristicId}|${period}`;
  }

  async load(key: string): Promise<EntryDraft | undefined> {
    return this.db.entryDrafts.get(key);
  }

  async save(key: string, form: unknown): Promise<EntryDraft> {
    const draft = { key, form: structuredClone(form), updatedAt: new Date().toISOString() };
    await this.db.entryDrafts.put(draft);
    return draft;
  }

  async clear(key: string): Promise<void> {
    await this.db.entryDrafts.delete(key);
  }

  /** Keys of every draft, for marking rows of the monthly list that have unsaved entries. */
  async keys(): Promise<string[]> {
    return (await this.db.entryDrafts.toCollection().primaryKeys()) as string[];
  }
}
