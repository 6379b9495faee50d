import { isLive } from '../domain/record-meta';
import type { Study } from '../domain/study';
import type { CapstanDatabase } from './database';
import { writePipelined } from './pipelined-write';
import { byMonthThenId, type StudyShelf } from './study-shelf';

/**
 * Studies as the rest of storage reads and writes them, kept on their characteristic's shelf (study-shelf.ts).
 * The only code that reads or writes what the shelves hold; other modules name `db.studyShelves` only to hold it
 * in a transaction or to count its rows and sequence. Each function runs inside the caller's transaction when
 * there is one (it must hold `db.studyShelves`); a write opens its own otherwise, so that reading a shelf and
 * putting it back are one step.
 */

/**
 * Shelves per bulkGet: Dexie asks IndexedDB key by key and hands back the part in one task; 250 shelves of 36
 * studies are some 9 000 studies to deserialise, a task of tens of milliseconds.
 */
const SHELVES_PER_GET = 250;

/**
 * Studies stored per bulkPut of a write (the shelves' whole contents, not only the studies written): the page
 * prepares one part (serialising is the writer's share) while the database writes the one before, and between
 * parts the page's thread is free (250 studies serialise well under 50 ms).
 */
const STUDIES_PER_PUT = 250;

/**
 * Shelves per bulkPut at the least. Dexie notes each key a put of fewer than 50 records writes (its live queries'
 * bookkeeping, dexie.mjs `observabilityMiddleware`), and a larger put as the whole table: written 7 shelves at a
 * time, a 20 000-process merge handed the page the keys of 20 000 shelves, one task of 347–354 ms on the page's
 * thread as the merge ended (the bench of 2026-12-04 and an ad-hoc long-task probe).
 */
const SHELVES_PER_PUT = 50;

/** The shelves of these characteristics that exist, read a part at a time. */
export async function shelvesOf(
  db: CapstanDatabase,
  characteristicIds: readonly string[]
): Promise<StudyShelf[]> {
  const out: StudyShelf[] = [];
  for (let i = 0; i < characteristicIds.length || i === 0; i += SHELVES_PER_GET) {
    // One bulkGet even for no key: returning without a request made the caller's next read fail with
    // "Transaction committed too early" (fake-indexeddb).
    for (const shelf of await db.studyShelves.bulkGet(characteristicIds.slice(i, i + SHELVES_PER_GET)))
      if (shelf) out.push(shelf);
  }
  return out;
}

/** Every study of these characteristics, live and deleted, each characteristic's in month order. */
export async function studiesUnder(
  db: CapstanDatabase,
  characteristicIds: readonly string[]
): Promise<Study[]> {
  return (await shelvesOf(db, characteristicIds)).flatMap((shelf) => shelf.studies);
}

/** Whether any study held is live (a shelf at a time, stopping at the first). */
export async function anyLiveStudy(db: CapstanDatabase): Promise<boolean> {
  return (await db.studyShelves.filter((shelf) => shelf.studies.some(isLive)).first()) !== undefined;
}

/** Every study of one characteristic, live and deleted, in month order. */
export async function studiesOf(db: CapstanDatabase, characteristicId: string): Promise<Study[]> {
  return (await db.studyShelves.get(characteristicId))?.studies ?? [];
}

/** Every study held, live and deleted. */
export async function allStudies(db: CapstanDatabase): Promise<Study[]> {
  return (await db.studyShelves.toArray()).flatMap((shelf) => shelf.studies);
}

/** Every study held, a shelf at a time through a cursor (no single long read). */
export async function eachStudy(db: CapstanDatabase, visit: (study: Study) => void): Promise<void> {
  await db.studyShelves.each((shelf) => {
    for (const s of shelf.studies) visit(s);
  });
}

/** Every study held, a part of some `shelves` shelves at a time in characteristic order (for a rebuild). */
export async function studiesInParts(
  db: CapstanDatabase,
  shelves: number,
  visit: (studies: Study[]) => void
): Promise<void> {
  const partAfter = (after: string | undefined) =>
    (after === undefined ? db.studyShelves.orderBy(':id') : db.studyShelves.where(':id').above(after))
      .limit(shelves)
      .toArray();
  // The next part is asked for before this one is used: the database reads it meanwhile.
  let next = partAfter(undefined);
  for (;;) {
    const part = await next;
    if (!part.length) break;
    next = partAfter(part[part.length - 1]!.characteristicId);
    visit(part.flatMap((shelf) => shelf.studies));
  }
}

/** Studies written after `seq` on this device (their `localSeq` above it). */
export async function studiesChangedSince(db: CapstanDatabase, seq: number): Promise<Study[]> {
  const shelves = await db.studyShelves.where('localSeq').above(seq).toArray();
  return shelves.flatMap((shelf) => shelf.studies.filter((s) => (seqOfStudy(s) ?? 0) > seq));
}

/**
 * Shelves written since a point up to which their studies are counted one by one: 100 shelves are some 3 600
 * studies to read. A company's file merged here writes thousands (72 000 studies read on the page's thread held
 * its portfolio 3 s longer with the CPU throttled 4×), and an index's keys are read one by one as well (2 000 keys
 * some 0.3 s there).
 */
const SHELVES_COUNTED_EXACTLY = 100;

/**
 * Studies written after `seq`: how many, and the lowest `localSeq` among them. Where more than
 * SHELVES_COUNTED_EXACTLY shelves were written since, `atLeast`: the count is the number of those shelves (each
 * holds one study written since, or more), and the oldest is that of the shelf written least recently.
 */
export async function unsentStudies(
  db: CapstanDatabase,
  seq: number
): Promise<{ count: number; oldest: number | undefined; atLeast: boolean }> {
  const written = db.studyShelves.where('localSeq').above(seq);
  let count = 0;
  let oldest: number | undefined;
  const visit = (shelf: StudyShelf) => {
    for (const s of shelf.studies) {
      const q = seqOfStudy(s) ?? 0;
      if (q <= seq) continue;
      count += 1;
      if (oldest === undefined || q < oldest) oldest = q;
    }
  };
  const shelves = await written.count();
  if (shelves > SHELVES_COUNTED_EXACTLY) {
    const first = await written.first();
    if (first) visit(first);
    return { count: shelves, oldest, atLeast: true };
  }
  await written.each(visit);
  return { count, oldest, atLeast: false };
}

/** How many shelves there are: one request. */
export async function countShelves(db: CapstanDatabase): Promise<number> {
  return db.studyShelves.count();
}

/**
 * A study by its id, live or deleted: on its characteristic's shelf when the characteristic is given, else
 * looked for on every shelf (a read of every study: for tests and for an id that arrives alone).
 */
export async function findStudy(
  db: CapstanDatabase,
  id: string,
  characteristicId?: string
): Promise<Study | undefined> {
  if (characteristicId !== undefined) return (await studiesOf(db, characteristicId)).find((s) => s.id === id);
  const shelf = await db.studyShelves.filter((sh) => sh.studies.some((s) => s.id === id)).first();
  return shelf?.studies.find((s) => s.id === id);
}

/** The studies of `ids` among those of `characteristicIds` (ids held on other shelves are not found). */
export async function studiesAmong(
  db: CapstanDatabase,
  characteristicIds: readonly string[],
  ids: ReadonlySet<string>
): Promise<Study[]> {
  return (await studiesUnder(db, characteristicIds)).filter((s) => ids.has(s.id));
}

function seqOfStudy(s: Study): number | undefined {
  return (s as Study & { localSeq?: number }).localSeq;
}

/** A study as written now: without the write sequence of the version it replaces (stamped again on its shelf). */
function unsequenced(s: Study): Study {
  if (seqOfStudy(s) === undefined) return s;
  const { localSeq: _was, ...rest } = s as Study & { localSeq?: number };
  void _was;
  return rest as Study;
}

/**
 * The shelves `incoming` makes of those `held`: each study in place of the one with its id, in parts of some
 * STUDIES_PER_PUT studies stored and SHELVES_PER_PUT shelves at the least; a part's `count` is how many of the
 * incoming studies it holds.
 */
function* shelvedInParts(
  incoming: ReadonlyMap<string, Study[]>,
  held: ReadonlyMap<string, StudyShelf>
): Generator<{ rows: StudyShelf[]; count: number }> {
  let rows: StudyShelf[] = [];
  let count = 0;
  let stored = 0;
  for (const [characteristicId, studies] of incoming) {
    const byId = new Map((held.get(characteristicId)?.studies ?? []).map((s) => [s.id, s]));
    for (const s of studies) byId.set(s.id, unsequenced(s));
    const shelved = [...byId.values()].sort(byMonthThenId);
    // `localSeq` and `size` are set again as the shelf is stored (local-sequence.ts).
    rows.push({ characteristicId, studies: shelved, size: shelved.length });
    count += studies.length;
    stored += shelved.length;
    if (stored >= STUDIES_PER_PUT && rows.length >= SHELVES_PER_PUT) {
      yield { rows, count };
      rows = [];
      count = 0;
      stored = 0;
    }
  }
  if (rows.length > 0) yield { rows, count };
}

/**
 * Writes studies — each a whole version — onto their characteristics' shelves, each in place of the study with
 * its id there, in one transaction. `onWritten` hears how many of them each part held, once it is written.
 */
export async function putStudies(
  db: CapstanDatabase,
  studies: readonly Study[],
  onWritten?: (count: number) => void
): Promise<void> {
  if (studies.length === 0) return;
  const byCharacteristic = new Map<string, Study[]>();
  for (const s of studies) {
    const list = byCharacteristic.get(s.characteristicId);
    if (list) list.push(s);
    else byCharacteristic.set(s.characteristicId, [s]);
  }
  await db.transaction('rw', db.studyShelves, async () => {
    const held = new Map(
      (await shelvesOf(db, [...byCharacteristic.keys()])).map((shelf) => [shelf.characteristicId, shelf])
    );
    await writePipelined(
      shelvedInParts(byCharacteristic, held),
      (shelves) => db.studyShelves.bulkPut(shelves),
      onWritten
    );
  });
}
