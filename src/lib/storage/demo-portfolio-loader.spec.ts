import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { ValidationError } from '../domain/validation-error';
import { isPortfolioEmpty, loadDemoPortfolio } from './demo-portfolio-loader';
import { listProcessOverviews, summariseDatabase } from './portfolio-overview';
import { openStorage, databaseOf } from './storage';

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
    await expect(loadDemoPortfolio(databaseOf(storage), demo)).rejects.toThrow(/only into an empty database/);
    const summary = await summariseDatabase(databaseOf(storage));
    expect(summary.tables.find((t) => t.name === 'Studies')?.live).toBe(demo.records.studies.length);
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
