import type { Table } from 'dexie';
import {
  editableOf,
  withoutFields,
  isLive,
  stampDeleted,
  stampNew,
  stampRestored,
  stampUpdate,
  type Editable,
  type RecordMeta,
  type WriteContext
} from '../domain/record-meta';
import { ValidationError } from '../domain/validation-error';
import type { CapstanDatabase } from './database';
import type { ValidationLoader } from './record-validation';
import { recordsInSlices } from './records-in-slices';

/**
 * Thrown when a record changed (in another tab, or by an import) after the person opened it for editing: their
 * edit is not saved over the other one. Nothing was written.
 */
export class EditConflictError extends Error {
  constructor(kind: string, name: string) {
    super(
      `${kind} “${name}” was changed elsewhere (another tab or an imported file) after you opened it, so your edit was not saved over that change. Open it again to see the other change, then redo your edit.`
    );
    this.name = 'EditConflictError';
  }
}

/** Thrown when an id names no live record; says which kind and which id. */
export class RecordNotFoundError extends Error {
  constructor(kind: string, id: string) {
    super(`${kind} ${id} does not exist (or was deleted)`);
    this.name = 'RecordNotFoundError';
  }
}

export interface RepositorySpec<T extends RecordMeta> {
  kind: string;
  table: (db: CapstanDatabase) => Table<T, string>;
  /** The kind's schema, loaded on the first write (record-validation.ts). */
  validation: ValidationLoader<Editable<T>>;
  /** Checks references and cross-record rules inside the write transaction; throws ValidationError. */
  checkInTransaction?: (db: CapstanDatabase, fields: Editable<T>, existingId?: string) => Promise<void>;
  /** Extra tables `checkInTransaction` reads. */
  relatedTables?: (db: CapstanDatabase) => Table[];
}

/**
 * Create, read, update and tombstone for one record kind. Every write validates first, then runs in one
 * read-write transaction that also holds the tables its checks read, so a refused write changes nothing.
 */
export class RecordRepository<T extends RecordMeta> {
  constructor(
    protected readonly db: CapstanDatabase,
    protected readonly ctx: WriteContext,
    protected readonly spec: RepositorySpec<T>
  ) {}

  protected get table(): Table<T, string> {
    return this.spec.table(this.db);
  }

  protected tables(): Table[] {
    return [this.table as unknown as Table, ...(this.spec.relatedTables?.(this.db) ?? [])];
  }

  /** Live records (tombstones left out), read a slice at a time (records-in-slices.ts). */
  async list(): Promise<T[]> {
    return recordsInSlices(this.table, isLive);
  }

  /**
   * How many live records there are: a cursor, record by record, so that counting 20 000 records never holds
   * the page in one long task as reading them all at once would.
   */
  async countLive(): Promise<number> {
    return this.table.filter(isLive).count();
  }

  /** A live record, or undefined. */
  async get(id: string): Promise<T | undefined> {
    const record = await this.table.get(id);
    return record && isLive(record) ? record : undefined;
  }

  async create(input: unknown): Promise<T> {
    const fields = (await this.spec.validation()).parse(input);
    return this.db.transaction('rw', this.tables(), async () => {
      await this.spec.checkInTransaction?.(this.db, fields);
      const record = stampNew(fields, this.ctx) as unknown as T;
      await this.table.add(record);
      return record;
    });
  }

  /**
   * Saves an edit. `expectedRev` is the revision the editor started from: if the stored record has moved on
   * since, the edit is refused (EditConflictError) instead of silently replacing the other change.
   */
  async update(id: string, input: unknown, expectedRev?: number): Promise<T> {
    const validation = await this.spec.validation();
    const fields = validation.parse(input);
    return this.db.transaction('rw', this.tables(), async () => {
      const previous = await this.table.get(id);
      if (!previous || !isLive(previous)) throw new RecordNotFoundError(this.spec.kind, id);
      if (expectedRev !== undefined && previous.rev !== expectedRev) {
        const name = (previous as unknown as { name?: unknown }).name;
        throw new EditConflictError(this.spec.kind, typeof name === 'string' ? name : id);
      }
      await this.spec.checkInTransaction?.(this.db, fields, id);
      const record = stampUpdate(withoutFields(previous, validation.fields), fields, this.ctx);
      await this.table.put(record);
      return record;
    });
  }

  /** Leaves a tombstone; returns it so that the caller can offer an undo. */
  async remove(id: string): Promise<T> {
    return this.db.transaction('rw', this.table, async () => {
      const previous = await this.table.get(id);
      if (!previous || !isLive(previous)) throw new RecordNotFoundError(this.spec.kind, id);
      const tombstone = stampDeleted(previous, this.ctx);
      await this.table.put(tombstone);
      return tombstone;
    });
  }

  /** Undoes a deletion as a new revision. */
  async restore(id: string): Promise<T> {
    return this.db.transaction('rw', this.table, async () => {
      const previous = await this.table.get(id);
      if (!previous) throw new RecordNotFoundError(this.spec.kind, id);
      if (isLive(previous)) return previous;
      const restored = stampRestored(previous, this.ctx);
      await this.table.put(restored);
      return restored;
    });
  }
}

/** Refuses a reference to a record that does not exist or is a tombstone. */
export async function requireLive(
  table: Table<RecordMeta, string>,
  id: string,
  recordKind: string,
  field: string,
  targetKind: string
): Promise<RecordMeta> {
  const target = await table.get(id);
  if (!target || !isLive(target)) {
    throw new ValidationError(recordKind, [{ field, message: `${targetKind} ${id} does not exist` }]);
  }
  return target;
}

/**
 * Archives a record (or brings it back) as an ordinary edit of its `archivedAt` field, so that it travels and
 * merges like any other edit. Refuses a record that does not exist.
 */
export async function archive<T extends RecordMeta & { archivedAt?: string }>(
  repository: RecordRepository<T>,
  id: string,
  archived: boolean,
  ctx: WriteContext
): Promise<T> {
  const record = await repository.get(id);
  if (!record) throw new RecordNotFoundError('Record', id);
  const { archivedAt: _was, ...rest } = editableOf(record) as Record<string, unknown>;
  void _was;
  return repository.update(
    id,
    archived ? { ...rest, archivedAt: ctx.now().toISOString() } : rest,
    record.rev
  );
}

export { withoutFields };
