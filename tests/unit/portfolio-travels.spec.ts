import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import { limitsFor } from '../../src/lib/domain/specification-history';
import type { CapstanStorage } from '../../src/lib/storage/storage';
import { closeDevice, exportBytes, openDevice, receiveBytes } from '../support/exchange-harness';

/**
 * Set-up records travel in exchange files under the ordinary conflict rules: the office's limit changes reach
 * a site, a site's edits to its own process, archive and project reach the office.
 */
const opened: CapstanStorage[] = [];
afterEach(async () => {
  for (const s of opened.splice(0)) await closeDevice(s);
});
async function device(label: string) {
  const s = await openDevice(label);
  opened.push(s);
  return s;
}

describe('a set-up portfolio travels', () => {
  it('limits from the office reach the site; the site’s process edits, archive and project reach the office', async () => {
    const office = await device('office');
    const site = await device('site');
    const plant = await office.sites.create({
      name: 'Brackwater Mill',
      region: '',
      timeZone: 'Europe/Dublin'
    });
    const process = await office.processes.create({
      siteId: plant.id,
      name: 'Sheet slitting',
      owner: 'R. Doyle',
      contextId: 'vehicle-parts',
      monthlyVolume: 4000,
      costPerDefective: 3,
      currency: 'EUR'
    });
    const ch = await office.characteristics.create({
      processId: process.id,
      name: 'Strip width',
      unit: 'mm',
      dataKind: 'measured',
      lsl: 49.8,
      target: 50,
      usl: 50.2,
      riskClass: 'standard',
      subgroupSize: 5
    });
    await receiveBytes(site, await exportBytes(office));

    // The office tightens the limits from 2026-09; the site renames the owner and starts a project meanwhile.
    await office.characteristics.changeLimits(ch.id, { from: '2026-09', lsl: 49.9, target: 50, usl: 50.1 });
    const local = (await site.processes.get(process.id))!;
    await site.processes.update(process.id, { ...local, owner: 'S. Keane', monthlyVolume: 4500 }, local.rev);
    const project = await site.projects.start(
      {
        processId: process.id,
        title: 'Less width spread',
        phase: 'Define',
        owner: 'S. Keane',
        startDate: '2026-10-01',
        expectedAnnualSaving: 1200
      },
      'site lead'
    );

    await receiveBytes(site, await exportBytes(office));
    await receiveBytes(office, await exportBytes(site));

    for (const d of [office, site]) {
      const c = (await d.characteristics.get(ch.id))!;
      expect(limitsFor(c, '2026-08')).toEqual({ lsl: 49.8, target: 50, usl: 50.2 });
      expect(limitsFor(c, '2026-09')).toEqual({ lsl: 49.9, target: 50, usl: 50.1 });
      expect(c.subgroupSize).toBe(5);
      expect((await d.processes.get(process.id))!).toMatchObject({ owner: 'S. Keane', monthlyVolume: 4500 });
      const p = (await d.projects.get(project.id))!;
      expect(p.phaseDates).toEqual({ Define: '2026-10-01' });
      expect(p.history?.[0]?.change).toBe('started in Define');
    }

    // Archive on the site and a phase change with its date: both arrive.
    await site.processes.setArchived(process.id, true);
    const p = (await site.projects.get(project.id))!;
    await site.projects.save(
      project.id,
      { ...p, phase: 'Measure', phaseDates: { ...p.phaseDates, Measure: '2026-11-02' } },
      'site lead',
      p.rev
    );
    await receiveBytes(office, await exportBytes(site));
    expect((await office.processes.get(process.id))!.archivedAt).toBeDefined();
    const atOffice = (await office.projects.get(project.id))!;
    expect(atOffice.phase).toBe('Measure');
    expect(atOffice.phaseDates).toEqual({ Define: '2026-10-01', Measure: '2026-11-02' });
    expect(atOffice.history?.at(-1)?.change).toMatch(/phase Define → Measure/);
  });
});
