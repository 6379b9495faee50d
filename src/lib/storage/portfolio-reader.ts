import type { Table } from 'dexie';
import {
  cellNumbersOf,
  columnsOfCellNumbers,
  MonthlyStatistics,
  type MonthlyStatisticsSnapshot,
  type SnapshotMaybeWithoutIds
} from '../domain/monthly-statistics';
import type { PortfolioRecords } from '../domain/portfolio-terms';
import { compareById, isLive, type RecordMeta } from '../domain/record-meta';
import type { Study } from '../domain/study';
import {
  CapstanDatabase,
  type PortfolioTables,
  type StoredReadModel,
  type StoredReadModelIds
} from './database';
import { allStudies, countShelves, studiesAmong, studiesChangedSince, studiesInParts } from './study-shelves';
import { summariseDatabase, type DatabaseSummary } from './portfolio-overview';

export type { DatabaseSummary };

/**
 * Read access to the portfolio for a background worker: the worker reads the records straight from IndexedDB,
 * so that the page never receives (and the browser never clones on the page's thread) tens of thousands of
 * studies it does not show. This module never writes a record; the only thing it writes is the device-local
 * read model it derives from the studies (a cache: deleting it loses nothing). It is the one part of storage a
 * worker may import (layer rule).
 *
 * The studies reach the worker as the read model (domain/monthly-statistics.ts), not as objects:
 * - on the first request, the stored model is read (one row) with the few studies it holds (raw values);
 * - then, and on every later request, only the studies written since the last read began (their `localSeq`,
 *   see SEQ_MARGIN_MS) are read and applied;
 * - the model is rebuilt from every study when there is none, when it asks for it, or when the shelves hold
 *   another number of studies than the model knows of (a study the sequence did not show);
 * - the model is stored again after it changed (`persist`, called once the answer is on its way).
 *
 * The sites, processes, characteristics and projects are kept with the model in the same way (PortfolioTables):
 * stored with it as one value, then brought up to date from the rows written since. IndexedDB charges for every
 * row read far more than for its bytes: in Chromium here a table of 2 000 processes took 50–120 ms to read, the four tables
 * of a 2 000-process company some 200 ms — every visit of the portfolio and the review — where one stored value
 * holding 2 000 characteristics and 2 000 processes took 23–35 ms. A table whose row count then differs from
 * the rows kept (a row removed outright, which the sequence cannot show) is read again in full.
 */
const READ_MODEL_KEY = 'monthly-statistics';
/**
 * The key of a model's ids (StoredReadModelIds) is this and their generation, so that whether the ids of a
 * generation are still stored is a question of keys alone (their value is 26 MB at company size).
 */
const READ_MODEL_IDS_PREFIX = 'monthly-statistics-ids:';
const READ_MODEL_FORMAT = 3;
/** Formats read: 1 kept a cell's numbers in six columns, 1 and 2 the ids with the model (see StoredReadModel). */
const READ_MODEL_FORMATS_READ: readonly number[] = [1, 2, 3];
/**
 * Which studies count as "written since": those whose `localSeq` is above the time the last read began, less a
 * margin. A write the last read did not see belongs to a read-write transaction created after that read's
 * (IndexedDB runs an overlapping read-write transaction created earlier before the read, which then sees it),
 * and every put in it is stamped after its transaction was created — so after the read began, by the one wall
 * clock every tab and worker of this browser reads (a tab's sequence may run ahead of that clock in a burst,
 * never behind it). The margin covers only rounding between threads' readings of that clock; it is kept small
 * because every study stamped within it is read again: a 2-second margin re-read the last 11 000 studies of a
 * large merge on the next portfolio visit. A study applied twice changes nothing. A wall clock found behind the
 * last read (set back) means a rebuild; a shelf of studies added or removed behind the sequence's back changes the
 * number of shelves beyond what the studies written since explain, which means a rebuild too.
 */
export const SEQ_MARGIN_MS = 250;

interface Feed {
  db: CapstanDatabase;
  model?: MonthlyStatistics;
  /** Every row of the four tables (tombstones included), in id order, as of `since`; kept with the model. */
  tables?: PortfolioTables;
  /** The live records of `tables`, handed out again while they do not change (so are the plans made of them). */
  live?: { of: PortfolioTables; records: Omit<PortfolioRecords, 'studies' | 'statistics'> };
  /** Studies with a `localSeq` above this are read as changed (see SEQ_MARGIN_MS). */
  since: number;
  /** Whether the model changed since it was last stored. */
  dirty: boolean;
  /** The generation of the stored ids the model was restored without (StoredReadModelIds). */
  idsGeneration?: string;
  /** Shelves of studies stored as of `since` (storage/study-shelf.ts); unknown for a model stored before. */
  shelves?: number;
}

const feeds = new Map<string, Feed>();

function feedOf(databaseName: string): Feed {
  let feed = feeds.get(databaseName);
  if (!feed)
    feeds.set(databaseName, (feed = { db: new CapstanDatabase(databaseName), since: 0, dirty: false }));
  return feed;
}

/**
 * The records on this device counted for the File exchange page (portfolio-overview.ts, summariseDatabase), on
 * the worker's own connection: it reads every study, some 5 s of small tasks at 20 000 processes × 36 months
 * (4.5–4.9 s to the page's counts, measured 2026-12-04), which the page's thread no longer spends.
 */
export function summariseRecords(databaseName: string): Promise<DatabaseSummary> {
  return summariseDatabase(feedOf(databaseName).db);
}

/** How the model was brought up to date, for the benchmark and the tests. */
export type ReadModelSource = 'memory' | 'stored' | 'rebuilt';

export interface PortfolioRead {
  /** Live sites, processes, characteristics and projects; the studies are in `records.statistics`. */
  records: PortfolioRecords & { statistics: MonthlyStatistics };
  source: ReadModelSource;
  /** Studies applied since the model was last up to date. */
  applied: number;
  /** How many of the four tables kept with the model were read in full (the others: only their rows written since). */
  tablesRead: number;
  /** Whether the stored model's ids were read (only when studies written since had to be applied). */
  idsRead: boolean;
  /** Stores the model if it changed; safe to skip (the next read rebuilds or catches up). */
  persist: () => Promise<void>;
}

/** The portfolio from the database the page has already opened, with its studies as the read model. */
export async function readPortfolio(databaseName: string): Promise<PortfolioRead> {
  const feed = feedOf(databaseName);
  const { db } = feed;
  let source: ReadModelSource = 'memory';
  if (!feed.model) {
    const restored = await restoreModel(db);
    if (restored) {
      feed.model = restored.model;
      feed.since = restored.since;
      feed.tables = restored.tables;
      feed.idsGeneration = restored.idsGeneration;
      feed.shelves = restored.shelves;
      source = 'stored';
    } else feed.tables = undefined;
  }
  const startedAt = Date.now();
  // The clock set back since the last read: stamps may now fall below `since`; read everything again.
  if (feed.model && startedAt + SEQ_MARGIN_MS < feed.since) {
    feed.model = undefined;
    feed.tables = undefined;
  }
  const read = await db.transaction(
    'r',
    [db.sites, db.processes, db.characteristics, db.studyShelves, db.projects],
    async () => {
      const tables = await tablesSince(db, feed.model ? feed.tables : undefined, feed.since);
      const changed = feed.model ? await studiesChangedSince(db, feed.since) : undefined;
      const shelves = await countShelves(db);
      return { tables, changed, shelves };
    }
  );
  if (read.tables.changed) feed.dirty = true;
  feed.tables = read.tables.tables;
  let applied = 0;
  let idsRead = false;
  if (feed.model?.idsToAttach && read.changed?.length) {
    // Studies to apply: the model needs the ids it was restored without. Gone or of another model (stored
    // meanwhile by another worker): built again from the studies.
    idsRead = true;
    const ids = await storedIds(db, feed.idsGeneration);
    try {
      if (!ids) throw new RangeError('no ids stored with this model');
      feed.model.attachIds(ids);
    } catch {
      feed.model = undefined;
    }
  }
  if (feed.model && read.changed) {
    const version = feed.model.version;
    feed.model.putAll(read.changed, seqOfRecord);
    if (feed.model.version !== version) {
      applied = read.changed.length;
      feed.dirty = true;
    }
    // Studies read again though they change nothing (written within the margin before the last read began, see
    // SEQ_MARGIN_MS) are read again at every visit, with the model's ids, until a model is stored with a later
    // `since`: the last 250 ms of a merge were 3 500 studies of a 2 000-process file, re-read and the ids read at
    // every visit of the portfolio and the review (0.1–0.25 s of each with the CPU throttled 4×).
    else if (read.changed.length > 0) feed.dirty = true;
  }
  // Shelves are only ever added, each by a write the sequence shows: fewer, or more new ones than the characteristics
  // of the studies written since, were added or removed behind its back.
  const shelvesExplained =
    feed.shelves === undefined ||
    (read.shelves >= feed.shelves &&
      read.shelves <= feed.shelves + new Set(read.changed?.map((s) => s.characteristicId)).size);
  feed.shelves = read.shelves;
  if (!feed.model || feed.model.needsRebuild || !shelvesExplained) {
    const rebuilt = await rebuildModel(db);
    feed.model = rebuilt.model;
    feed.dirty = true;
    source = 'rebuilt';
    applied = rebuilt.model.known;
  }
  feed.since = startedAt - SEQ_MARGIN_MS;
  const model = feed.model;
  const tables = feed.tables;
  if (feed.live?.of !== tables) feed.live = { of: tables, records: liveRecordsOf(tables) };
  return {
    records: { ...feed.live.records, studies: [], statistics: model },
    source,
    applied,
    tablesRead: read.tables.readInFull,
    idsRead,
    persist: async () => {
      if (!feed.dirty || feed.model !== model || feed.tables !== tables) return;
      feed.dirty = false;
      const since = feed.since;
      const shelves = feed.shelves;
      if (model.idsToAttach) {
        // Nothing in the model changed (applying a study attaches its ids): the ids stored stand, unless another
        // worker stored a model of its own meanwhile.
        const kept = feed.idsGeneration;
        await db.transaction('rw', db.readModels, async () => {
          if ((await db.readModels.where(':id').equals(`${READ_MODEL_IDS_PREFIX}${kept}`).count()) === 0)
            return;
          await db.readModels.put(storedForm(model.snapshotWithoutIds(), since, tables, kept, shelves));
        });
        return;
      }
      const { ids, ...rest } = model.snapshot();
      const generation = crypto.randomUUID();
      await db.transaction('rw', db.readModels, async () => {
        await db.readModels.where(':id').startsWith(READ_MODEL_IDS_PREFIX).delete();
        await db.readModels.bulkPut([
          storedForm(rest, since, tables, generation, shelves),
          {
            key: `${READ_MODEL_IDS_PREFIX}${generation}`,
            format: READ_MODEL_FORMAT,
            generation,
            ids: ids.join(SEPARATOR)
          }
        ]);
      });
      feed.idsGeneration = generation;
    }
  };
}

/** The kinds kept with the model (PortfolioTables). */
const TABLE_KINDS = ['sites', 'processes', 'characteristics', 'projects'] as const;

function liveRecordsOf(tables: PortfolioTables): Omit<PortfolioRecords, 'studies' | 'statistics'> {
  return {
    sites: tables.sites.filter(isLive),
    processes: tables.processes.filter(isLive),
    characteristics: tables.characteristics.filter(isLive),
    projects: tables.projects.filter(isLive)
  };
}

/**
 * The four tables as they are now, inside the caller's read transaction: from the rows kept (`held`, as of
 * `since`) with those written since, or read in full where nothing is kept or the table's row count shows a row
 * the sequence did not (removed outright). `changed` says whether anything differs from `held`; `readInFull`, how
 * many tables were read whole.
 */
async function tablesSince(
  db: CapstanDatabase,
  held: PortfolioTables | undefined,
  since: number
): Promise<{ tables: PortfolioTables; changed: boolean; readInFull: number }> {
  const tables = { ...held } as Record<(typeof TABLE_KINDS)[number], RecordMeta[]>;
  let changed = false;
  let readInFull = 0;
  for (const kind of TABLE_KINDS) {
    const table = db[kind] as unknown as Table<RecordMeta, string>;
    const kept = held?.[kind] as RecordMeta[] | undefined;
    if (kept) {
      const [written, rows] = await Promise.all([
        table.where('localSeq').above(since).toArray(),
        table.count()
      ]);
      const next = withRowsWritten(kept, written);
      if (next.length === rows) {
        if (next !== kept) changed = true;
        tables[kind] = next;
        continue;
      }
    }
    tables[kind] = await table.toArray();
    changed = true;
    readInFull += 1;
  }
  return { tables: changed || !held ? (tables as unknown as PortfolioTables) : held, changed, readInFull };
}

/**
 * `kept` (in id order) with the rows written since put in, in id order as the table gives them; `kept` itself
 * when none differs from the row kept (the margin reads the last writes before `since` again).
 */
function withRowsWritten(kept: RecordMeta[], written: RecordMeta[]): RecordMeta[] {
  if (written.length === 0) return kept;
  const byId = new Map(kept.map((r) => [r.id, r]));
  let differs = false;
  for (const r of written) {
    const before = byId.get(r.id);
    if (before && seqOfRecord(before) === seqOfRecord(r)) continue;
    byId.set(r.id, r);
    differs = true;
  }
  if (!differs) return kept;
  // Ids compared as IndexedDB orders string keys (by UTF-16 code unit), as a full read returns them.
  return [...byId.values()].sort(compareById);
}

function seqOfRecord(r: RecordMeta): number {
  return (r as RecordMeta & { localSeq?: number }).localSeq ?? 0;
}

/** Shelves read per request when rebuilding (some 20 000 studies): the worker never holds every study at once. */
const REBUILD_SHELVES = 500;

/** The model built from every study, read some shelves at a time in one transaction. */
async function rebuildModel(db: CapstanDatabase): Promise<{ model: MonthlyStatistics }> {
  return db.transaction('r', db.studyShelves, async () => {
    const model = new MonthlyStatistics();
    await studiesInParts(db, REBUILD_SHELVES, (studies) => model.appendNew(studies, seqOfRecord));
    if (!model.needsRebuild) return { model };
    // Two live studies in one month (a clash from before one-study-per-month): weigh them with every study at
    // hand.
    return { model: MonthlyStatistics.fromStudies(await allStudies(db), seqOfRecord) };
  });
}

/** The ids stored with the model of this generation (split), or undefined when none are. */
async function storedIds(db: CapstanDatabase, generation: string | undefined): Promise<string[] | undefined> {
  if (generation === undefined) return undefined;
  const stored = (await db.readModels.get(`${READ_MODEL_IDS_PREFIX}${generation}`)) as
    StoredReadModelIds | undefined;
  if (!stored || stored.generation !== generation) return undefined;
  return stored.ids === '' ? [] : stored.ids.split(SEPARATOR);
}

async function restoreModel(db: CapstanDatabase): Promise<
  | {
      model: MonthlyStatistics;
      since: number;
      tables?: PortfolioTables;
      idsGeneration?: string;
      shelves?: number;
    }
  | undefined
> {
  const stored = (await db.readModels.get(READ_MODEL_KEY)) as StoredReadModel | undefined;
  if (!stored || !READ_MODEL_FORMATS_READ.includes(stored.format)) return undefined;
  const snap = snapshotOf(stored);
  // A month that holds two studies shows one of them by its id: such a model is restored with its ids.
  if (!snap.ids && snap.heldIds.some(([, ids]) => ids.length > 1)) {
    snap.ids = await storedIds(db, stored.idsGeneration);
    if (!snap.ids) return undefined;
  }
  // A held study is on the shelf of its cell's row (its characteristic).
  const wanted = new Set(snap.heldIds.flatMap(([, ids]) => ids));
  const rowsHeld = new Set(snap.heldIds.map(([cell]) => snap.rowIds[Math.floor(cell / snap.span)]!));
  const byId = new Map<string, Study>();
  for (const s of await studiesAmong(db, [...rowsHeld], wanted)) if (isLive(s)) byId.set(s.id, s);
  let restored: ReturnType<typeof MonthlyStatistics.fromSnapshot>;
  try {
    restored = MonthlyStatistics.fromSnapshot(snap, byId);
  } catch {
    return undefined;
  }
  const { model, missing } = restored;
  // A held study gone or deleted without the sequence showing it: the stored model cannot be trusted.
  if (missing.length) return undefined;
  // A model stored before the tables were kept with it: they are read in full this once, then stored with it.
  return {
    model,
    since: stored.since,
    ...(stored.tables ? { tables: stored.tables } : {}),
    ...(stored.idsGeneration !== undefined ? { idsGeneration: stored.idsGeneration } : {}),
    ...(stored.shelves !== undefined ? { shelves: stored.shelves } : {})
  };
}

const SEPARATOR = '\n';

/** The snapshot as stored (exported for the benchmark, which restores it as a worker does). */
export function storedForm(
  snap: Omit<MonthlyStatisticsSnapshot, 'ids'>,
  since: number,
  tables?: PortfolioTables,
  idsGeneration?: string,
  shelves?: number
): StoredReadModel {
  return {
    ...(tables ? { tables } : {}),
    ...(shelves !== undefined ? { shelves } : {}),
    ...(idsGeneration !== undefined ? { idsGeneration } : {}),
    key: READ_MODEL_KEY,
    format: READ_MODEL_FORMAT,
    since,
    firstMonth: snap.firstMonth,
    span: snap.span,
    rowIds: snap.rowIds.join(SEPARATOR),
    kind: snap.kind,
    numbers: cellNumbersOf(snap),
    tag: snap.tag,
    heldIds: snap.heldIds,
    tombstones: snap.tombstones.join(SEPARATOR),
    savedAt: new Date().toISOString()
  };
}

/** The model's six columns from a stored model of either format. */
function columnsOf(
  stored: StoredReadModel
): Pick<MonthlyStatisticsSnapshot, 'n' | 'mean' | 'sd' | 'units' | 'count' | 'opportunities'> {
  const size = stored.kind.length;
  if (!stored.numbers) {
    const zeros = () => new Float64Array(size);
    return {
      n: stored.n ?? zeros(),
      mean: stored.mean ?? zeros(),
      sd: stored.sd ?? zeros(),
      units: stored.units ?? zeros(),
      count: stored.count ?? zeros(),
      opportunities: stored.opportunities ?? zeros()
    };
  }
  return columnsOfCellNumbers(stored.kind, stored.numbers);
}

/** The snapshot of a stored model; without `ids` when they are kept apart (format 3). */
export function snapshotOf(stored: StoredReadModel): SnapshotMaybeWithoutIds {
  const split = (text: string) => (text === '' ? [] : text.split(SEPARATOR));
  const size = stored.kind.length;
  return {
    format: 1,
    firstMonth: stored.firstMonth,
    span: stored.span,
    rowIds: split(stored.rowIds),
    kind: stored.kind,
    ...columnsOf(stored),
    tag: stored.tag,
    ...(stored.ids !== undefined
      ? { ids: stored.ids === '' && size === 0 ? [] : stored.ids.split(SEPARATOR) }
      : {}),
    heldIds: stored.heldIds,
    tombstones: split(stored.tombstones)
  };
}

/** Forgets the models held in memory (tests: a new worker starts with none). */
export function forgetReadModels(): void {
  for (const feed of feeds.values()) feed.db.close();
  feeds.clear();
}
