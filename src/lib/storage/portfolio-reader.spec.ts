import 'fake-indexeddb/auto';
import fc from 'fast-check';
import type { Table } from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { rankPortfolio, type PortfolioRecords } from '../domain/portfolio-ranking';
import { editableOf, type RecordMeta } from '../domain/record-meta';
import type { Study } from '../domain/study';
import { loadDemoPortfolio } from './demo-portfolio-loader';
import { loadPortfolioRecords } from './portfolio-overview';
import { forgetReadModels, readPortfolio } from './portfolio-reader';
import type { CapstanDatabase, StoredReadModel } from './database';
import { allStudies, putStudies } from './study-shelves';
import { databaseOf, openStorage, type CapstanStorage } from './storage';

/**
 * The worker's view of the portfolio: the studies as a read model, stored between visits and brought up to date
 * from the studies written since. Whatever path it took, the ranking it gives must be the ranking of the records
 * read in full.
 */
let storage: CapstanStorage | undefined;
afterEach(async () => {
  forgetReadModels();
  if (storage) {
    databaseOf(storage).close();
    await databaseOf(storage).delete();
  }
  storage = undefined;
});

/** Removes a study with its shelf, without a write the sequence shows (as no code of the app does). */
async function removeOutright(db: CapstanDatabase, study: Study): Promise<void> {
  // The whole shelf: a study taken off a shelf put back by hand is not seen (the shelf keeps its sequence), and
  // no code of the app takes one off.
  await db.studyShelves.delete(study.characteristicId);
}

/** A kind's records read, written and removed outright, studies through their shelves. */
function tableForTest(
  db: CapstanDatabase,
  kind: 'sites' | 'processes' | 'characteristics' | 'studies' | 'projects'
) {
  if (kind !== 'studies') return db[kind] as unknown as Table<RecordMeta & { name?: string }, string>;
  return {
    toArray: async () => allStudies(db) as Promise<(RecordMeta & { name?: string })[]>,
    put: async (row: RecordMeta) => putStudies(db, [row as Study]),
    delete: async (id: string) =>
      removeOutright(
        db,
        (await allStudies(db)).find((x) => x.id === id)!
      )
  };
}

/** The ranking's figures, comparable across record sets (rows are new objects each time). */
function figuresOf(records: PortfolioRecords) {
  return rankPortfolio(records, BUILT_IN_PROFILES, { endPeriod: '2026-10', windowMonths: 3 }).map((r) => ({
    id: r.process.id,
    status: r.status,
    yield: r.yield,
    zLevel: r.zLevel,
    trend: r.trend,
    characteristics: r.characteristics.map((c) => ({ status: c.status, result: c.result, months: c.months }))
  }));
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** The records besides the studies, live only: what a full read gives and what the reader keeps. */
function tablesPart(r: Pick<PortfolioRecords, 'sites' | 'processes' | 'characteristics' | 'projects'>) {
  return { sites: r.sites, processes: r.processes, characteristics: r.characteristics, projects: r.projects };
}

/** Replaces one summary study of 2026-10 as a person logging it again would (its sd made tiny). */
async function replaceAStudy(s: CapstanStorage): Promise<void> {
  const someStudy = (await loadPortfolioRecords(databaseOf(s))).studies.find(
    (x) => x.data.kind === 'summary' && x.period === '2026-10'
  )!;
  await s.studies.logOne(
    {
      characteristicId: someStudy.characteristicId,
      period: someStudy.period,
      data: { kind: 'summary', n: 40, mean: (someStudy.data as { mean: number }).mean, sd: 1e-3 },
      enteredBy: 'test'
    },
    'replace'
  );
}

/** The demo with its read model stored, and no worker holding it: where a later visit starts. */
async function withStoredModel() {
  const s = await withDemo();
  await (await readPortfolio(s.databaseName)).persist();
  forgetReadModels();
  return { s, db: databaseOf(s) };
}

async function withDemo(): Promise<CapstanStorage> {
  storage = await openStorage(`reader-${Math.random().toString(36).slice(2)}`);
  await loadDemoPortfolio(databaseOf(storage), demo);
  return storage;
}

describe('portfolio reader', () => {
  it('builds the read model on the first visit, stores it, and restores it on the next', async () => {
    const s = await withDemo();
    const full = figuresOf(await loadPortfolioRecords(databaseOf(s)));
    const first = await readPortfolio(s.databaseName);
    expect(first.source).toBe('rebuilt');
    expect(first.records.studies).toEqual([]);
    expect(figuresOf(first.records)).toEqual(full);
    await first.persist();
    forgetReadModels(); // a new worker: nothing in memory
    const second = await readPortfolio(s.databaseName);
    expect(second.source).toBe('stored');
    expect(figuresOf(second.records)).toEqual(full);
  });

  it('applies only what was written since, as the sequence shows it, and gives the full ranking', async () => {
    const s = await withDemo();
    const before = await readPortfolio(s.databaseName);
    const figuresBefore = figuresOf(before.records);
    await before.persist();
    forgetReadModels();
    await replaceAStudy(s);
    const after = await readPortfolio(s.databaseName);
    expect(after.source).toBe('stored');
    expect(after.applied).toBeGreaterThanOrEqual(1);
    // The margin re-reads writes stamped just before the last read: the demo's load may be within it, so more
    // than one may be read.
    expect(figuresOf(after.records)).toEqual(figuresOf(await loadPortfolioRecords(databaseOf(s))));
    expect(figuresOf(after.records)).not.toEqual(figuresBefore);
    const again = await readPortfolio(s.databaseName);
    expect(again.source).toBe('memory');
    expect(figuresOf(again.records)).toEqual(figuresOf(await loadPortfolioRecords(databaseOf(s))));
  });

  it('keeps the other records with the stored model and reads only the rows written since', async () => {
    const s = await withDemo();
    const db = databaseOf(s);
    const first = await readPortfolio(s.databaseName);
    expect(first.tablesRead).toBe(4);
    await first.persist();
    forgetReadModels();
    const second = await readPortfolio(s.databaseName);
    expect(second.tablesRead).toBe(0);
    expect(tablesPart(second.records)).toEqual(tablesPart(await loadPortfolioRecords(db)));
    // An edit, a deletion (a tombstone) and a new record, written as the app writes them.
    const line = second.records.processes[0]!;
    await s.processes.update(line.id, { ...editableOf(line), name: 'Renamed line' }, line.rev);
    const gone = second.records.projects[0]!;
    await s.projects.remove(gone.id);
    const site = await s.sites.create({ name: 'Works added later', region: '', timeZone: 'UTC' });
    await second.persist();
    forgetReadModels();
    const third = await readPortfolio(s.databaseName);
    expect(third.tablesRead).toBe(0);
    const full = await loadPortfolioRecords(db);
    expect(tablesPart(third.records)).toEqual(tablesPart(full));
    expect(third.records.processes.find((p) => p.id === line.id)?.name).toBe('Renamed line');
    expect(third.records.projects.some((p) => p.id === gone.id)).toBe(false);
    expect(third.records.sites.some((x) => x.id === site.id)).toBe(true);
    expect(figuresOf(third.records)).toEqual(figuresOf(full));
    // Kept in memory, and unchanged: the same arrays again (the ranking's plan, made of them, is kept too).
    const fourth = await readPortfolio(s.databaseName);
    expect(fourth.source).toBe('memory');
    expect(fourth.records.processes).toBe(third.records.processes);
  });

  it('reads a table in full again when it lost a row the sequence did not show', async () => {
    const { s, db } = await withStoredModel();
    const victim = (await db.processes.toArray())[0]!;
    await db.processes.delete(victim.id); // removed outright: no write the sequence can show
    const after = await readPortfolio(s.databaseName);
    expect(after.tablesRead).toBe(1);
    expect(after.records.processes.some((p) => p.id === victim.id)).toBe(false);
    expect(tablesPart(after.records)).toEqual(tablesPart(await loadPortfolioRecords(db)));
  });

  it('reads the tables once from a model stored without them, then keeps them with it', async () => {
    const { s, db } = await withStoredModel();
    // As stored before the tables were kept with the model.
    await db.readModels.toCollection().modify((m) => {
      delete (m as StoredReadModel).tables;
    });
    const older = await readPortfolio(s.databaseName);
    expect(older.source).toBe('stored');
    expect(older.tablesRead).toBe(4);
    expect(tablesPart(older.records)).toEqual(tablesPart(await loadPortfolioRecords(db)));
    await older.persist();
    forgetReadModels();
    expect((await readPortfolio(s.databaseName)).tablesRead).toBe(0);
  });

  it('rebuilds when a shelf of studies is gone without a write the sequence showed (removed outright)', async () => {
    const s = await withDemo();
    await (await readPortfolio(s.databaseName)).persist();
    forgetReadModels();
    const db = databaseOf(s);
    const victim = (await allStudies(db))[0]!;
    await removeOutright(db, victim); // not a tombstone: no write the sequence can show
    const after = await readPortfolio(s.databaseName);
    expect(after.source).toBe('rebuilt');
    expect(figuresOf(after.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
  });

  it('shows the newer of two live studies of one month (a clash from before one study per month), as a full read does', async () => {
    const s = await withDemo();
    await (await readPortfolio(s.databaseName)).persist();
    const db = databaseOf(s);
    const shown = (await allStudies(db)).find((x) => x.period === '2026-10' && x.data.kind === 'summary')!;
    const clock = `${String(Date.parse('2026-11-01T00:00:00Z')).padStart(13, '0')}-0000-${shown.deviceId}`;
    await putStudies(db, [
      {
        ...shown,
        id: `${shown.id}-twin`,
        clock,
        data: { kind: 'summary', n: 40, mean: 0, sd: 1 }
      }
    ]);
    await pause(300); // past the margin: the twin is read once, not again by the last visit below
    for (const fresh of [false, true]) {
      if (fresh) forgetReadModels();
      const after = await readPortfolio(s.databaseName);
      expect(figuresOf(after.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
      await after.persist();
    }
    // Stored with the clash: restored with its ids at once (the month shows one of its two studies by id).
    forgetReadModels();
    const restored = await readPortfolio(s.databaseName);
    expect(restored.source).toBe('stored');
    expect(restored.records.statistics.idsToAttach).toBe(false);
    expect(figuresOf(restored.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
  });

  it('reads a model stored in the first and second formats (the ids with the model; format 1: six columns)', async () => {
    for (const format of [1, 2]) {
      const s = await withDemo();
      const db = databaseOf(s);
      const first = await readPortfolio(s.databaseName);
      await first.persist();
      const snap = first.records.statistics.snapshot();
      await db.readModels.where(':id').startsWith('monthly-statistics-ids:').delete();
      await db.readModels.toCollection().modify((m) => {
        const stored = m as StoredReadModel;
        delete stored.idsGeneration;
        stored.format = format;
        stored.ids = snap.ids.join('\n');
        if (format === 1) {
          delete stored.numbers;
          Object.assign(stored, {
            n: snap.n,
            mean: snap.mean,
            sd: snap.sd,
            units: snap.units,
            count: snap.count,
            opportunities: snap.opportunities
          });
        }
      });
      forgetReadModels();
      const older = await readPortfolio(s.databaseName);
      expect(older.source).toBe('stored');
      expect(older.records.statistics.idsToAttach).toBe(false);
      expect(figuresOf(older.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
      forgetReadModels();
      databaseOf(s).close();
      await databaseOf(s).delete();
      storage = undefined;
    }
  });

  it('restores without the ids when nothing was written since, and reads them to apply what was', async () => {
    const s = await withDemo();
    const db = databaseOf(s);
    await pause(300); // past the margin (SEQ_MARGIN_MS): the demo's writes are not read again
    await (await readPortfolio(s.databaseName)).persist();
    forgetReadModels();
    const second = await readPortfolio(s.databaseName);
    expect(second.source).toBe('stored');
    expect(second.idsRead).toBe(false);
    expect(second.records.statistics.idsToAttach).toBe(true);
    expect(figuresOf(second.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
    // A process renamed: the tables change, the model does not; stored again without reading the ids.
    const line = second.records.processes[0]!;
    await s.processes.update(line.id, { ...editableOf(line), name: 'Renamed line' }, line.rev);
    await pause(300);
    const renamed = await readPortfolio(s.databaseName);
    expect(renamed.idsRead).toBe(false);
    await renamed.persist();
    forgetReadModels();
    const third = await readPortfolio(s.databaseName);
    expect(third.idsRead).toBe(false);
    expect(third.records.processes.find((p) => p.id === line.id)?.name).toBe('Renamed line');
    // A study replaced: its ids are read to apply it, and the figures are those of a full read.
    await replaceAStudy(s);
    await pause(300); // so that the visit after the next one does not read it again
    forgetReadModels();
    const fourth = await readPortfolio(s.databaseName);
    expect(fourth.source).toBe('stored');
    expect(fourth.idsRead).toBe(true);
    expect(fourth.applied).toBeGreaterThanOrEqual(1);
    expect(figuresOf(fourth.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
    await fourth.persist();
    forgetReadModels();
    const fifth = await readPortfolio(s.databaseName);
    expect(fifth.idsRead).toBe(false);
    expect(figuresOf(fifth.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
  });

  it('stores the model again after reading studies that change nothing, so that later visits do not read them', async () => {
    const s = await withDemo();
    await pause(300); // past the margin (SEQ_MARGIN_MS): the demo's writes are not read again
    await (await readPortfolio(s.databaseName)).persist();
    // A study written, then read at once: within the margin, so it counts as written since that read as well.
    await replaceAStudy(s);
    await (await readPortfolio(s.databaseName)).persist();
    await pause(300);
    forgetReadModels();
    // Read again from the stored model: it changes nothing, and the model is stored again past it.
    const again = await readPortfolio(s.databaseName);
    expect(again.idsRead).toBe(true);
    expect(again.applied).toBe(0);
    await again.persist();
    forgetReadModels();
    const later = await readPortfolio(s.databaseName);
    expect(later.source).toBe('stored');
    expect(later.idsRead).toBe(false);
    expect(figuresOf(later.records)).toEqual(figuresOf(await loadPortfolioRecords(databaseOf(s))));
  });

  it('builds the model again when its stored ids are gone and a study must be applied', async () => {
    const { s, db } = await withStoredModel();
    await db.readModels.where(':id').startsWith('monthly-statistics-ids:').delete();
    const study = (await allStudies(db)).find((x) => x.data.kind === 'summary')!;
    await putStudies(db, [
      { ...study, rev: study.rev + 1, data: { kind: 'summary', n: 30, mean: 0, sd: 1 } }
    ]);
    const after = await readPortfolio(s.databaseName);
    expect(after.idsRead).toBe(true);
    expect(after.source).toBe('rebuilt');
    expect(figuresOf(after.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
  });

  it('starts afresh from a stored model of another format', async () => {
    const s = await withDemo();
    await (await readPortfolio(s.databaseName)).persist();
    forgetReadModels();
    const db = databaseOf(s);
    await db.readModels.toCollection().modify((m) => {
      m.format = 99;
    });
    expect((await readPortfolio(s.databaseName)).source).toBe('rebuilt');
  });

  /**
   * Invariant: whatever was written, removed, stored and forgotten in between, the reader's sites, processes,
   * characteristics and projects are those of a full read of the tables, and its ranking that of the records read
   * in full (fast-check, random histories).
   */
  it('gives the records of a full read after any history of writes, removals, stores and new workers (property)', async () => {
    const kinds = ['sites', 'processes', 'characteristics', 'projects', 'studies'] as const;
    const step = fc.oneof(
      fc.record({
        op: fc.constantFrom('edit', 'tombstone', 'add', 'remove'),
        kind: fc.constantFrom(...kinds),
        pick: fc.nat()
      }),
      fc.record({ op: fc.constantFrom('read', 'persist', 'forget') })
    );
    await fc.assert(
      fc.asyncProperty(fc.array(step, { minLength: 1, maxLength: 12 }), async (steps) => {
        const s = await withDemo();
        const db = databaseOf(s);
        let last: Awaited<ReturnType<typeof readPortfolio>> | undefined = await readPortfolio(s.databaseName);
        const same = async () => {
          last = await readPortfolio(s.databaseName);
          const full = await loadPortfolioRecords(db);
          expect(tablesPart(last.records)).toEqual(tablesPart(full));
          expect(figuresOf(last.records)).toEqual(figuresOf(full));
        };
        let added = 0;
        for (const x of steps) {
          if (x.op === 'read') await same();
          else if (x.op === 'persist') await last?.persist();
          else if (x.op === 'forget') {
            forgetReadModels(); // a new worker: the last read's database is closed with the old one
            last = undefined;
          } else if ('kind' in x) {
            const table = tableForTest(db, x.kind);
            const rows = await table.toArray();
            const row = rows[x.pick % rows.length];
            if (!row) continue;
            const data = x.kind === 'studies' ? (row as unknown as Study).data : undefined;
            if (x.op === 'edit' && data) {
              const edited = data.kind === 'summary' ? { ...data, mean: data.mean + 0.01 } : data;
              await table.put({ ...row, rev: row.rev + 1, data: edited } as typeof row);
            } else if (x.op === 'edit')
              await table.put({ ...row, rev: row.rev + 1, name: `${row.name ?? ''} (edited)` });
            else if (x.op === 'tombstone')
              await table.put({ ...row, rev: row.rev + 1, deletedAt: new Date().toISOString() });
            else if (x.op === 'add') await table.put({ ...row, id: `added-${(added += 1)}` });
            else await table.delete(row.id); // outright: the sequence cannot show it
          }
        }
        await same();
        forgetReadModels();
        databaseOf(s).close();
        await databaseOf(s).delete();
        storage = undefined;
      }),
      { numRuns: 20 }
    );
  }, 60_000);
});
