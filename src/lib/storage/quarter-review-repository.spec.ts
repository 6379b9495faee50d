import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { parseDemoPortfolio } from '../domain/demo-portfolio-schema';
import { buildQuarterReview } from '../domain/quarter-review';
import { ValidationError } from '../domain/validation-error';
import { openStorage, type CapstanStorage, databaseOf } from './storage';

let storage: CapstanStorage;
beforeEach(async () => {
  storage = await openStorage(`reviews-${Math.random()}`);
});
afterEach(async () => {
  databaseOf(storage).close();
  await databaseOf(storage).delete();
});

describe('quarterly review records', () => {
  const a = '11111111-1111-4111-8111-111111111111';
  const b = '22222222-2222-4222-8222-222222222222';

  it('keeps one review per quarter and set of sites, in whatever order the sites are given', async () => {
    await storage.reviews.saveNote('2026-Q3', [b, a], 'headline', 'Better than Q2.');
    const second = await storage.reviews.saveNote('2026-Q3', [a, b], 'movers', 'Two real improvers.');
    expect(second.rev).toBe(2);
    expect(second.notes).toEqual({ headline: 'Better than Q2.', movers: 'Two real improvers.' });
    expect(await databaseOf(storage).reviews.count()).toBe(1);
    expect(await storage.reviews.find('2026-Q3', [a])).toBeUndefined();
  });

  it('freezes and unfreezes figures, and refuses a note that is too long, writing nothing', async () => {
    const figures = buildQuarterReview(parseDemoPortfolio(demo).records, BUILT_IN_PROFILES, {
      quarter: '2026-Q3'
    });
    const frozen = await storage.reviews.freeze('2026-Q3', [], figures, '2026-10-15T09:00:00.000Z');
    expect(frozen.snapshot?.figures.headline).toEqual(figures.headline);
    await expect(storage.reviews.saveNote('2026-Q3', [], 'sites', 'x'.repeat(4001))).rejects.toBeInstanceOf(
      ValidationError
    );
    expect((await storage.reviews.find('2026-Q3', []))?.rev).toBe(1);
    const thawed = await storage.reviews.unfreeze('2026-Q3', []);
    expect(thawed.snapshot).toBeUndefined();
  });
});
