import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { addMonths, currentPeriodIn, futurePeriodProblem } from '../domain/period';
import type { SummaryData } from '../domain/study';
import { ValidationError } from '../domain/validation-error';
import { EntryDraftRepository } from './entry-draft-repository';
import { openStorage, type CapstanStorage, databaseOf } from './storage';
import { allStudies } from './study-shelves';

let storage: CapstanStorage;
let charId: string;
let countedId: string;
let n = 0;

beforeEach(async () => {
  n += 1;
  storage = await openStorage(`capstan-logging-${n}`);
  const site = await storage.sites.create({ name: 'Plant', region: '', timeZone: 'UTC' });
  const process = await storage.processes.create({
    siteId: site.id,
    name: 'Press',
    owner: '',
    contextId: 'vehicle-parts',
    monthlyVolume: 1,
    costPerDefective: 1,
    currency: 'EUR'
  });
  charId = (
    await storage.characteristics.create({
      processId: process.id,
      name: 'Width',
      unit: 'mm',
      dataKind: 'measured',
      lsl: 9,
      usl: 11,
      riskClass: 'standard'
    })
  ).id;
  countedId = (
    await storage.characteristics.create({
      processId: process.id,
      name: 'Cracks',
      unit: '',
      dataKind: 'counted',
      riskClass: 'key'
    })
  ).id;
});

afterEach(async () => {
  storage.close();
  await databaseOf(storage).delete();
});

const summary = (mean: number, sd = 0.2, nn = 30) => ({
  characteristicId: charId,
  period: '2026-05',
  data: { kind: 'summary', n: nn, mean, sd },
  enteredBy: 'Ana'
});

describe('logging a month', () => {
  it('refuses a month that has not begun at the site, and writes nothing', async () => {
    const next = addMonths(currentPeriodIn('UTC'), 1);
    await expect(storage.studies.logOne({ ...summary(10), period: next }, 'new')).rejects.toThrow(
      new RegExp(`${next} has not begun yet at Plant \\(it is ${currentPeriodIn('UTC')} there, UTC\\)`)
    );
    expect(await storage.studies.forCharacteristic(charId)).toHaveLength(0);
    // The month under way may be logged as it goes.
    expect(
      (await storage.studies.logOne({ ...summary(10), period: currentPeriodIn('UTC') }, 'new')).action
    ).toBe('created');
  });

  it('judges "not begun" in the site\'s own time zone', () => {
    // 2026-12-31 23:30 UTC is already January 2027 in Auckland, still December in Honolulu.
    const at = Date.parse('2026-12-31T23:30:00Z');
    expect(futurePeriodProblem('2027-01', { name: 'A', timeZone: 'Pacific/Auckland' }, at)).toBeUndefined();
    expect(futurePeriodProblem('2027-01', { name: 'H', timeZone: 'Pacific/Honolulu' }, at)).toMatch(
      /not begun/
    );
  });

  it('creates, then refuses a second entry unless told to replace or combine', async () => {
    expect((await storage.studies.logOne(summary(10), 'new')).action).toBe('created');
    await expect(storage.studies.logOne(summary(10.1), 'new')).rejects.toThrow(
      /already has a study for 2026-05; replace or combine/
    );
  });

  it('replace keeps the earlier version as a revision that can be restored', async () => {
    const first = await storage.studies.logOne(summary(10), 'new');
    const second = await storage.studies.logOne(summary(10.5), 'replace');
    expect(second.action).toBe('replaced');
    expect(second.study.id).toBe(first.study.id);
    expect(second.study.rev).toBe(2);
    expect((second.study.data as SummaryData).mean).toBe(10.5);
    const revisions = await storage.studies.revisionsOf(first.study.id);
    expect(revisions.map((r) => (r.study.data as SummaryData).mean)).toEqual([10]);
    const restored = await storage.studies.restoreRevision(revisions[0]!.id);
    expect((restored.data as SummaryData).mean).toBe(10);
    expect(restored.rev).toBe(3);
    expect((await storage.studies.revisionsOf(first.study.id)).map((r) => r.reason).sort()).toEqual([
      'replaced',
      'restored'
    ]);
  });

  it('combine pools the two entries exactly', async () => {
    await storage.studies.logOne(summary(10, 0.2, 30), 'new');
    const r = await storage.studies.logOne(summary(11, 0.2, 30), 'combine');
    expect(r.action).toBe('combined');
    const d = r.study.data as SummaryData;
    expect(d.n).toBe(60);
    expect(d.mean).toBeCloseTo(10.5, 12);
  });

  it('a batch with one bad entry writes nothing, and names the entry', async () => {
    const before = (await allStudies(databaseOf(storage))).length;
    const batch = [
      summary(10),
      {
        characteristicId: countedId,
        period: '2026-05',
        data: { kind: 'defectives', units: 10, defectives: 12 },
        enteredBy: ''
      }
    ];
    const error = await storage.studies.logMany(batch, 'new').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ValidationError);
    expect((error as ValidationError).problems[0]?.field).toBe('[2].data.defectives');
    expect(await allStudies(databaseOf(storage))).toHaveLength(before);
  });

  it('keeps drafts per characteristic and month until cleared', async () => {
    const key = EntryDraftRepository.keyOf(charId, '2026-05');
    await storage.drafts.save(key, { kind: 'summary', n: '30', mean: '10,2' });
    expect((await storage.drafts.load(key))?.form).toEqual({ kind: 'summary', n: '30', mean: '10,2' });
    expect(await storage.drafts.keys()).toEqual([key]);
    await storage.drafts.clear(key);
    expect(await storage.drafts.load(key)).toBeUndefined();
  });
});
