import { MonthlyStatistics, type MonthlyStatisticsSnapshot } from '../domain/monthly-statistics';
import type { PortfolioRecords } from '../domain/portfolio-terms';
import { isLive } from '../domain/record-meta';
import type { Study } from '../domain/study';
import { CapstanDatabase, type StoredReadModel } from './database';

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
 * - the model is rebuilt from every study when there is none, when it asks for it, or when the studies table
 *   holds another number of rows than the model knows of (a row the sequence did not show);
 * - the model is stored again after it changed (`persist`, called once the answer is on its way).
 */
const READ_MODEL_KEY = 'monthly-statistics';
const READ_MODEL_FORMAT = 1;
/**
 * Which studies count as "written since": those whose `localSeq` is above the time the last read began, less a
 * margin. A write the last read did not see belongs to a read-write transaction created after that read's
 * (IndexedDB runs an overlapping read-write transaction created earlier before the read, which then sees it),
 * and every put in it is stamped after its transaction was created — so after the read began, by the one wall
 * clock every tab and worker of this browser reads (a tab's sequence may run ahead of that clock in a burst,
 * never behind it). The margin covers only rounding between threads' readings of that clock; it is kept small
 * because every study stamped within it is read again: a 2-second margin re-read the last 11 000 studies of a
 * large merge on the next portfolio visit. A study applied twice changes nothing. A wall clock found behind the
 * last read (set back) means a rebuild; a study added behind the sequence's back changes the row count, which
 * means a rebuild too.
 */
const SEQ_MARGIN_MS = 250;

interface Feed {
  db: CapstanDatabase;
  model?: MonthlyStatistics;
  /** Studies with a `localSeq` above this are read as changed (see SEQ_MARGIN_MS). */
  since: number;
  /** Whether the model changed since it was last stored. */
  dirty: boolean;
}

const feeds = new Map<string, Feed>();

function feedOf(databaseName: string): Feed {
  let feed = feeds.get(databaseName);
  if (!feed)
    feeds.set(databaseName, (feed = { db: new CapstanDatabase(databaseName), since: 0, dirty: false }));
  return feed;
}

/** How the model was brought up to date, for the benchmark and the tests. */
export type ReadModelSource = 'memory' | 'stored' | 'rebuilt';

export interface PortfolioRead {
  /** Live sites, processes, characteristics and projects; the studies are in `records.statistics`. */
  records: PortfolioRecords & { statistics: MonthlyStatistics };
  source: ReadModelSource;
  /** Studies applied since the model was last up to date. */
  applied: number;
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
      source = 'stored';
    }
  }
  const startedAt = Date.now();
  // The clock set back since the last read: stamps may now fall below `since`; read everything again.
  if (feed.model && startedAt + SEQ_MARGIN_MS < feed.since) feed.model = undefined;
  const read = await db.transaction(
    'r',
    [db.sites, db.processes, db.characteristics, db.studies, db.projects],
    async () => {
      const [sites, processes, characteristics, projects] = await Promise.all([
        db.sites.toArray(),
        db.processes.toArray(),
        db.characteristics.toArray(),
        db.projects.toArray()
      ]);
      const changed = feed.model ? await db.studies.where('localSeq').above(feed.since).toArray() : undefined;
      const rows = await db.studies.count();
      return { sites, processes, characteristics, projects, changed, rows };
    }
  );
  let applied = 0;
  if (feed.model && read.changed) {
    const version = feed.model.version;
    feed.model.putAll(read.changed, seqOf);
    if (feed.model.version !== version) {
      applied = read.changed.length;
      feed.dirty = true;
    }
  }
  if (!feed.model || feed.model.needsRebuild || feed.model.known !== read.rows) {
    const rebuilt = await rebuildModel(db);
    feed.model = rebuilt.model;
    feed.dirty = true;
    source = 'rebuilt';
    applied = rebuilt.model.known;
  }
  feed.since = startedAt - SEQ_MARGIN_MS;
  const model = feed.model;
  return {
    records: {
      sites: read.sites.filter(isLive),
      processes: read.processes.filter(isLive),
      characteristics: read.characteristics.filter(isLive),
      studies: [],
      projects: read.projects.filter(isLive),
      statistics: model
    },
    source,
    applied,
    persist: async () => {
      if (!feed.dirty || feed.model !== model) return;
      feed.dirty = false;
      await db.readModels.put(storedForm(model.snapshot(), feed.since));
    }
  };
}

/** Studies read per request when rebuilding: the worker never holds every study at once. */
const REBUILD_PAGE = 20_000;

/** The model built from every study, read a page at a time by id in one transaction. */
async function rebuildModel(db: CapstanDatabase): Promise<{ model: MonthlyStatistics }> {
  return db.transaction('r', db.studies, async () => {
    const model = new MonthlyStatistics();
    const pageAfter = (after: string | undefined) =>
      (after === undefined ? db.studies.orderBy(':id') : db.studies.where(':id').above(after))
        .limit(REBUILD_PAGE)
        .toArray();
    // The next page is asked for before this one is added: the database reads it meanwhile.
    let next = pageAfter(undefined);
    for (;;) {
      const page = await next;
      if (!page.length) break;
      next = pageAfter(page[page.length - 1]!.id);
      model.appendNew(page, seqOf);
    }
    if (!model.needsRebuild) return { model };
    // Two live studies in one month across pages (a clash from before one-study-per-month): weigh them with
    // every study at hand.
    const studies = await db.studies.toArray();
    return { model: MonthlyStatistics.fromStudies(studies, seqOf) };
  });
}

function seqOf(s: Study): number {
  return (s as Study & { localSeq?: number }).localSeq ?? 0;
}

async function restoreModel(
  db: CapstanDatabase
): Promise<{ model: MonthlyStatistics; since: number } | undefined> {
  const stored = await db.readModels.get(READ_MODEL_KEY);
  if (!stored || stored.format !== READ_MODEL_FORMAT) return undefined;
  const snap = snapshotOf(stored);
  const wanted = snap.heldIds.flatMap(([, ids]) => ids);
  const held = await db.studies.bulkGet(wanted);
  const byId = new Map<string, Study>();
  for (const s of held) if (s && isLive(s)) byId.set(s.id, s);
  const { model, missing } = MonthlyStatistics.fromSnapshot(snap, byId);
  // A held study gone or deleted without the sequence showing it: the stored model cannot be trusted.
  return missing.length ? undefined : { model, since: stored.since };
}

const SEPARATOR = '\n';

/** The snapshot as stored (exported for the benchmark, which restores it as a worker does). */
export function storedForm(snap: MonthlyStatisticsSnapshot, since: number): StoredReadModel {
  return {
    key: READ_MODEL_KEY,
    format: READ_MODEL_FORMAT,
    since,
    firstMonth: snap.firstMonth,
    span: snap.span,
    rowIds: snap.rowIds.join(SEPARATOR),
    kind: snap.kind,
    n: snap.n,
    mean: snap.mean,
    sd: snap.sd,
    units: snap.units,
    count: snap.count,
    opportunities: snap.opportunities,
    tag: snap.tag,
    ids: snap.ids.join(SEPARATOR),
    heldIds: snap.heldIds,
    tombstones: snap.tombstones.join(SEPARATOR),
    savedAt: new Date().toISOString()
  };
}

export function snapshotOf(stored: StoredReadModel): MonthlyStatisticsSnapshot {
  const split = (text: string) => (text === '' ? [] : text.split(SEPARATOR));
  const size = stored.kind.length;
  const ids = stored.ids === '' && size === 0 ? [] : stored.ids.split(SEPARATOR);
  return {
    format: 1,
    firstMonth: stored.firstMonth,
    span: stored.span,
    rowIds: split(stored.rowIds),
    kind: stored.kind,
    n: stored.n,
    mean: stored.mean,
    sd: stored.sd,
    units: stored.units,
    count: stored.count,
    opportunities: stored.opportunities,
    tag: stored.tag,
    ids,
    heldIds: stored.heldIds,
    tombstones: split(stored.tombstones)
  };
}

/** Forgets the models held in memory (tests: a new worker starts with none). */
export function forgetReadModels(): void {
  for (const feed of feeds.values()) feed.db.close();
  feeds.clear();
}
