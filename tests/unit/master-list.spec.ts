import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import { readMasterList } from '../../src/lib/spreadsheet/master-list-csv';
import { databaseOf, openStorage, type CapstanStorage } from '../../src/lib/storage/storage';
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { masterListCounts, planMasterList } from '../../src/lib/domain/master-list';

const EMPTY = { sites: [], processes: [], characteristics: [] };
const plan = (
  text: string,
  existing: Parameters<typeof planMasterList>[1] = EMPTY,
  fromPeriod = '2026-06'
) => {
  const read = readMasterList(text);
  return {
    read,
    plan: planMasterList(read.rows, existing, BUILT_IN_PROFILES, { decimal: read.decimal, fromPeriod })
  };
};

const COMMA = [
  'site,time zone,region,process,owner,context,monthly volume,cost per defective,currency,characteristic,unit,data kind,lsl,target,usl,risk class',
  'Aldgate Works,Europe/London,South,Die casting — cell 1,M. Oyelaran,vehicle-parts,12000,7.5,GBP,Wall thickness,mm,measured,2.4,2.5,2.6,key',
  'Aldgate Works,Europe/London,South,Die casting — cell 1,M. Oyelaran,vehicle-parts,12000,7.5,GBP,Porosity rejects,,counted,,,,standard',
  'Aldgate Works,Europe/London,South,Trimming,M. Oyelaran,Vehicle parts,8000,2,GBP,Burr height,mm,measured,,,0.2,standard'
].join('\n');

const SEMICOLON = [
  'Site;Time zone;Region;Process;Owner;Context;Monthly volume;Cost per defective;Currency;Characteristic;Unit;Data kind;LSL;Target;USL;Risk class',
  'Werk Nord;Europe/Berlin;Nord;Drehen — Zelle 2;K. Braun;vehicle-parts;20000;1,25;EUR;Durchmesser;mm;measured;24,98;24,99;25,00;key'
].join('\n');

describe('master list, both CSV dialects', () => {
  it('reads commas with decimal points, and names contexts by id or by name', () => {
    const { read, plan: p } = plan(COMMA);
    expect(read.delimiter).toBe(',');
    expect(read.decimal).toBe('.');
    expect(p.badRows).toEqual([]);
    expect(masterListCounts(p)).toMatchObject({ newSites: 1, newProcesses: 2, newCharacteristics: 3 });
    expect(p.processes.create.map((x) => x.contextId)).toEqual(['vehicle-parts', 'vehicle-parts']);
  });

  it('reads semicolons with decimal commas', () => {
    const { read, plan: p } = plan(SEMICOLON);
    expect(read.delimiter).toBe(';');
    expect(read.decimal).toBe(',');
    expect(p.characteristics.create[0]).toMatchObject({ lsl: 24.98, target: 24.99, usl: 25 });
    expect(p.processes.create[0]).toMatchObject({ costPerDefective: 1.25, monthlyVolume: 20000 });
  });
});

describe('bad rows', () => {
  it('are named by line with every reason, with the messages of the forms', () => {
    const text = [
      COMMA.split('\n')[0],
      'Aldgate Works,Europe/London,South,Cell 1,,vehicle-parts,100,1,GBP,Width,mm,measured,2.6,,2.4,standard',
      'Aldgate Works,Europe/London,South,Cell 1,,space-travel,100,1,GBP,Height,mm,measured,1,,2,critical',
      'Aldgate Works,Europe/London,South,Cell 1,,vehicle-parts,100,1,GBP,,mm,measured,1,,2,standard',
      'Aldgate Works,Europe/London,South,Cell 2,,vehicle-parts,100,1,GBP,Depth,mm,measured,1,,2,standard',
      'Aldgate Works,Europe/London,South,Cell 2,,vehicle-parts,100,1,GBP,Depth,mm,measured,1,,2,standard'
    ].join('\n');
    const { plan: p } = plan(text);
    expect(p.badRows).toEqual([
      { line: 2, reasons: ['usl: USL (2.4) must be greater than LSL (2.6)'] },
      {
        line: 3,
        reasons: [
          "context: 'space-travel' is not a known industry context (use its name or id)",
          "risk class: 'critical' must be 'standard', 'key' or 'safety'"
        ]
      },
      { line: 4, reasons: ['characteristic: Characteristic name is required'] },
      { line: 6, reasons: ["characteristic: 'Depth' appears twice in process 'Cell 2' (also line 5)"] }
    ]);
  });
});

describe('importing an edited list again', () => {
  let s: CapstanStorage | undefined;
  afterEach(async () => {
    if (s) {
      databaseOf(s).close();
      await databaseOf(s).delete();
    }
  });

  it('adds new rows, turns changed limits into a change from the chosen month, and duplicates nothing', async () => {
    s = await openStorage(`master-${Math.random().toString(36).slice(2)}`);
    await s.masterList.apply(plan(COMMA).plan);
    const edited =
      COMMA.replace('2.4,2.5,2.6,key', '2.42,2.5,2.58,key') +
      '\nAldgate Works,Europe/London,South,Trimming,M. Oyelaran,vehicle-parts,8000,2,GBP,Edge radius,mm,measured,0.5,,1.5,standard';
    const again = plan(edited, await s.masterList.existing(), '2026-07').plan;
    expect(masterListCounts(again)).toMatchObject({
      newSites: 0,
      newProcesses: 0,
      newCharacteristics: 1,
      limitChanges: 1
    });
    await s.masterList.apply(again);
    const chars = await s.characteristics.list();
    expect(chars.map((c) => c.name).sort()).toEqual([
      'Burr height',
      'Edge radius',
      'Porosity rejects',
      'Wall thickness'
    ]);
    const wall = chars.find((c) => c.name === 'Wall thickness')!;
    expect(wall).toMatchObject({
      lsl: 2.4,
      usl: 2.6,
      limitChanges: [{ from: '2026-07', lsl: 2.42, target: 2.5, usl: 2.58 }]
    });
    // The same list once more changes nothing.
    const third = plan(edited, await s.masterList.existing(), '2026-07').plan;
    expect(masterListCounts(third)).toEqual({
      newSites: 0,
      updatedSites: 0,
      newProcesses: 0,
      updatedProcesses: 0,
      newCharacteristics: 0,
      updatedCharacteristics: 0,
      limitChanges: 0,
      badRows: 0
    });
    expect((await s.sites.list()).length).toBe(1);
  });

  it('is all or nothing: a list with a bad row writes nothing', async () => {
    s = await openStorage(`master-${Math.random().toString(36).slice(2)}`);
    const bad = plan(
      COMMA + '\nAldgate Works,Europe/London,South,Cell 9,,vehicle-parts,1,1,GBP,X,mm,measured,,,,standard'
    ).plan;
    expect(bad.badRows.map((b) => b.line)).toEqual([5]);
    await expect(s.masterList.apply(bad)).rejects.toThrow(/1 row\(s\) cannot be used; nothing was imported/);
    expect(await s.sites.list()).toHaveLength(0);
  });
});
