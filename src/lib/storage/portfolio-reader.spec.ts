import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { rankPortfolio, type PortfolioRecords } from '../domain/portfolio-ranking';
import { loadDemoPortfolio } from './demo-portfolio-loader';
import { loadPortfolioRecords } from './portfolio-overview';
import { forgetReadModels, readPortfolio } from './portfolio-reader';
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

  it('rebuilds when the studies table holds a row the sequence did not show', async () => {
    const s = await withDemo();
    await (await readPortfolio(s.databaseName)).persist();
    forgetReadModels();
    const db = databaseOf(s);
    const victim = (await db.studies.toArray())[0]!;
    await db.studies.delete(victim.id); // not a tombstone: no write the sequence can show
    const after = await readPortfolio(s.databaseName);
    expect(after.source).toBe('rebuilt');
    expect(figuresOf(after.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
  });

  it('shows the newer of two live studies of one month (a clash from before one study per month), as a full read does', async () => {
    const s = await withDemo();
    await (await readPortfolio(s.databaseName)).persist();
    const db = databaseOf(s);
    const shown = (await db.studies.toArray()).find(
      (x) => x.period === '2026-10' && x.data.kind === 'summary'
    )!;
    const clock = `${String(Date.parse('2026-11-01T00:00:00Z')).padStart(13, '0')}-0000-${shown.deviceId}`;
    await db.studies.put({
      ...shown,
      id: `${shown.id}-twin`,
      clock,
      data: { kind: 'summary', n: 40, mean: 0, sd: 1 }
    });
    for (const fresh of [false, true]) {
      if (fresh) forgetReadModels();
      const after = await readPortfolio(s.databaseName);
      expect(figuresOf(after.records)).toEqual(figuresOf(await loadPortfolioRecords(db)));
    }
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
});
