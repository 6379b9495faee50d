/**
 * Bookkeeping every stored record carries, so that files from different devices can be merged later
 * without losing or resurrecting anything.
 *
 * - `id` is a UUID that never changes, whatever device created the record.
 * - `rev` starts at 1 and grows by one on every write, on whichever device makes it.
 * - `deviceId` names the device of the last write; `createdAt`/`updatedAt` are ISO 8601 UTC times of that device.
 * - `deletedAt` set means the record is a tombstone: it stays stored so that the deletion travels to other devices.
 */
export interface RecordMeta {
  id: string;
  createdAt: string;
  updatedAt: string;
  rev: number;
  deviceId: string;
  deletedAt?: string;
}

/** What a writer needs to stamp a record: kept as an argument so the domain stays free of clocks and globals. */
export interface WriteContext {
  deviceId: string;
  now: () => Date;
  newId: () => string;
}

export const META_KEYS = ['id', 'createdAt', 'updatedAt', 'rev', 'deviceId', 'deletedAt'] as const;

/** The fields a caller edits: everything but the bookkeeping. */
export type Editable<T extends RecordMeta> = Omit<T, keyof RecordMeta>;

/** Stamps a new record (rev 1). */
export function stampNew<T extends object>(fields: T, ctx: WriteContext): T & RecordMeta {
  const at = ctx.now().toISOString();
  return { ...fields, id: ctx.newId(), createdAt: at, updatedAt: at, rev: 1, deviceId: ctx.deviceId };
}

/** Stamps a change to an existing record: same id and creation time, next revision. */
export function stampUpdate<T extends RecordMeta>(previous: T, fields: Editable<T>, ctx: WriteContext): T {
  return {
    ...previous,
    ...fields,
    id: previous.id,
    createdAt: previous.createdAt,
    updatedAt: ctx.now().toISOString(),
    rev: previous.rev + 1,
    deviceId: ctx.deviceId
  } as T;
}

/** Turns a record into a tombstone. Its fields stay so that a conflicting edit elsewhere can be shown beside it. */
export function stampDeleted<T extends RecordMeta>(previous: T, ctx: WriteContext): T {
  const at = ctx.now().toISOString();
  return { ...previous, updatedAt: at, deletedAt: at, rev: previous.rev + 1, deviceId: ctx.deviceId };
}

/** Undoes a deletion as a new revision (never by rewriting history). */
export function stampRestored<T extends RecordMeta>(previous: T, ctx: WriteContext): T {
  const restored: T = {
    ...previous,
    updatedAt: ctx.now().toISOString(),
    rev: previous.rev + 1,
    deviceId: ctx.deviceId
  };
  delete restored.deletedAt;
  return restored;
}

export function isLive(record: RecordMeta): boolean {
  return record.deletedAt === undefined;
}
