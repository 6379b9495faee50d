import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { rankPortfolio } from '../domain/portfolio-ranking';
import { databaseOf, openStorage, type CapstanStorage } from './storage';

/** Setting up and maintaining a portfolio: processes and characteristics, limits from a month, projects. */
let s: CapstanStorage;
beforeEach(async () => {
  s = await openStorage(`setup-${Math.random().toString(36).slice(2)}`);
});
afterEach(async () => {
  databaseOf(s).close();
  await databaseOf(s).delete();
});

async function plant() {
  const site = await s.sites.create({ name: 'Brackley Forge', region: 'East', timeZone: 'Europe/London' });
  const process = await s.processes.create({
    siteId: site.id,
    name: 'Hot forging — press 1',
    owner: 'D. Amadi',
    contextId: 'vehicle-parts',
    monthlyVolume: 9000,
    costPerDefective: 12,
    currency: 'GBP'
  });
  const ch = await s.characteristics.create({
    processId: process.id,
    name: 'Flange thickness',
    unit: 'mm',
    dataKind: 'measured',
    lsl: 11.8,
    target: 12,
    usl: 12.2,
    riskClass: 'key',
    subgroupSize: 5,
    physicalMin: 0
  });
  await s.studies.logOne(
    {
      characteristicId: ch.id,
      period: '2026-05',
      data: { kind: 'summary', n: 50, mean: 12.02, sd: 0.04 },
      enteredBy: 'D'
    },
    'new'
  );
  return { site, process, ch };
}

describe('processes and characteristics', () => {
  it('deleting a process takes its characteristics and studies along after the count is known, and undo brings them back', async () => {
    const { process, ch } = await plant();
    expect(await s.processes.countsUnder(process.id)).toEqual({ characteristics: 1, studies: 1 });
    const removal = await s.processes.removeWithContents(process.id);
    expect(await s.characteristics.get(ch.id)).toBeUndefined();
    expect(await s.studies.forCharacteristic(ch.id)).toHaveLength(0);
    await s.processes.undoRemoval(removal);
    expect(await s.characteristics.get(ch.id)).toBeDefined();
    expect(await s.studies.forCharacteristic(ch.id)).toHaveLength(1);
  });

  it('an archived process keeps its records but leaves the ranking; bringing it back returns it', async () => {
    const { process } = await plant();
    await s.processes.setArchived(process.id, true);
    const rank = async () =>
      rankPortfolio(await s.read.portfolioRecords(), BUILT_IN_PROFILES, {
        endPeriod: '2026-05',
        windowMonths: 1
      });
    expect(await rank()).toHaveLength(0);
    expect((await s.read.portfolioRecords()).studies).toHaveLength(1);
    await s.processes.setArchived(process.id, false);
    expect(await rank()).toHaveLength(1);
  });

  it('limits change from a month: the months before keep theirs, bad limits are refused by field', async () => {
    const { ch } = await plant();
    const changed = await s.characteristics.changeLimits(ch.id, {
      from: '2026-06',
      lsl: 11.9,
      target: 12,
      usl: 12.1
    });
    expect(changed.lsl).toBe(11.8);
    expect(changed.limitChanges).toEqual([{ from: '2026-06', lsl: 11.9, target: 12, usl: 12.1 }]);
    await expect(
      s.characteristics.changeLimits(ch.id, { from: '2026-07', lsl: 12.3, usl: 12.1 })
    ).rejects.toThrow(/USL \(12.1\) must be greater than LSL \(12.3\) \(limits from 2026-07\)/);
  });
});

describe('improvement projects', () => {
  it('keep the date each phase was entered and a history of what changed, by whom', async () => {
    const { process } = await plant();
    const p = await s.projects.start(
      {
        processId: process.id,
        title: 'Flange thickness to target',
        phase: 'Define',
        owner: 'D. Amadi',
        startDate: '2026-06-01',
        expectedAnnualSaving: 18000
      },
      'Quality office'
    );
    expect(p.phaseDates).toEqual({ Define: '2026-06-01' });
    const { id: _i, createdAt: _c, updatedAt: _u, rev: _r, deviceId: _d, vv: _v, clock: _k, ...fields } = p;
    void [_i, _c, _u, _r, _d, _v, _k];
    const next = await s.projects.save(
      p.id,
      { ...fields, phase: 'Measure', targetLevel: 1.67 },
      'D. Amadi',
      p.rev
    );
    expect(Object.keys(next.phaseDates!)).toEqual(['Define', 'Measure']);
    expect(next.history!.map((h) => h.change)).toEqual([
      'started in Define',
      'phase Define → Measure; target level 1.67'
    ]);
    await expect(
      s.projects.save(p.id, { ...fields, state: 'cancelled' }, 'D. Amadi', next.rev)
    ).rejects.toThrow(/A cancelled project needs a reason/);
    const closed = await s.projects.save(
      p.id,
      { ...fields, phase: 'Measure', state: 'cancelled', stateReason: 'press replaced' },
      'Q',
      next.rev
    );
    expect(closed.history!.at(-1)!.change).toMatch(/cancelled: press replaced/);
  });
});
