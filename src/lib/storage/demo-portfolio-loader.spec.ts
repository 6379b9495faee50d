import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { ValidationError } from '../domain/validation-error';
import { DEMO_SITE_IDS } from '../domain/demo-portfolio';
import { isDemoPresent, isPortfolioEmpty, loadDemoPortfolio } from './demo-portfolio-loader';
import { listProcessOverviews, summariseDatabase } from './portfolio-overview';
import { openStorage, databaseOf } from './storage';
import { allStudies } from './study-shelves';

describe('demo portfolio loading', () => {
  it('loads every record into an empty database and refuses a second load', async () => {
    const storage = await openStorage('capstan-demo-test');
    expect(await isPortfolioEmpty(databaseOf(storage))).toBe(true);
    const result = await loadDemoPortfolio(databaseOf(storage), demo);
    expect(result).toEqual({
      sites: demo.records.sites.length,
      processes: demo.records.processes.length,
      characteristics: demo.records.characteristics.length,
      studies: demo.records.studies.length,
      projects: demo.records.projects.length
    });
    const rows = await listProcessOverviews(databaseOf(storage));
    expect(rows).toHaveLength(demo.records.processes.length);
    expect(rows.every((r) => r.characteristics.length >= 1 && r.characteristics.length <= 3)).toBe(true);
    // The latest live month of each characteristic, as the file's own studies give it.
    const expected = new Map<string, string>();
    for (const s of demo.records.studies)
      if (!('deletedAt' in s) && s.period > (expected.get(s.characteristicId) ?? ''))
        expected.set(s.characteristicId, s.period);
    const ids = demo.records.characteristics.map((c) => c.id);
    expect(await storage.read.latestMonths(ids)).toEqual(expected);
    // A deleted latest study leaves the month before it as the latest.
    const [someId, month] = [...expected].find(([id]) =>
      demo.records.studies.some((s) => s.characteristicId === id && s.period < expected.get(id)!)
    )!;
    const latestStudy = demo.records.studies.find(
      (s) => s.characteristicId === someId && s.period === month
    )!;
    await storage.studies.remove(latestStudy.id, someId);
    const before = demo.records.studies
      .filter((s) => s.characteristicId === someId && s.period < month)
      .reduce((a, s) => (s.period > a ? s.period : a), '');
    expect((await storage.read.latestMonths([someId])).get(someId)).toBe(before);
    await storage.studies.restore(latestStudy.id, someId);
    await expect(loadDemoPortfolio(databaseOf(storage), demo)).rejects.toThrow(/already loaded/);
    const summary = await summariseDatabase(databaseOf(storage));
    expect(summary.tables.find((t) => t.name === 'Studies')?.live).toBe(demo.records.studies.length);
    storage.close();
    await databaseOf(storage).delete();
  });

  it('names the demo by its site ids, which are the sites of the demo file', () => {
    expect([...DEMO_SITE_IDS].sort()).toEqual(demo.records.sites.map((s) => s.id).sort());
  });

  it('loads beside the user’s own records and is removed without touching them', async () => {
    const storage = await openStorage('capstan-demo-beside');
    const site = await storage.sites.create({ name: 'Own Plant', region: '', timeZone: 'Europe/Paris' });
    const process = await storage.processes.create({
      siteId: site.id,
      name: 'Own line',
      owner: '',
      contextId: 'vehicle-parts',
      monthlyVolume: 100,
      costPerDefective: 1,
      currency: 'EUR'
    });
    await storage.loadDemo(demo);
    expect(await storage.demoPresent()).toBe(true);
    const removed = await storage.removeDemo();
    expect(removed.sites).toBe(demo.records.sites.length);
    expect(removed.processes).toBe(demo.records.processes.length);
    expect(removed.studies).toBe(demo.records.studies.length);
    expect(await isDemoPresent(databaseOf(storage))).toBe(false);
    expect((await storage.sites.list()).map((s) => s.name)).toEqual(['Own Plant']);
    expect((await storage.processes.list()).map((p) => p.id)).toEqual([process.id]);
    // No orphan: every demo study is a tombstone now.
    const live = (await allStudies(databaseOf(storage))).filter((s) => !s.deletedAt);
    expect(live).toHaveLength(0);
    // Once removed, it stays removed here (same ids; a reload would undo the removal on this device only).
    await expect(storage.loadDemo(demo)).rejects.toThrow(/was removed/);
    storage.close();
    await databaseOf(storage).delete();
  });

  it('refuses a damaged file without writing anything', async () => {
    const storage = await openStorage('capstan-demo-bad');
    const damaged = structuredClone(demo) as { records: { studies: { period: string }[] } };
    damaged.records.studies[5]!.period = '2025-14';
    await expect(loadDemoPortfolio(databaseOf(storage), damaged)).rejects.toBeInstanceOf(ValidationError);
    expect(await isPortfolioEmpty(databaseOf(storage))).toBe(true);
    storage.close();
    await databaseOf(storage).delete();
  });
});
