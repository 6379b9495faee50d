import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run-cli';

const dir = mkdtempSync(join(tmpdir(), 'capstan-portfolio-'));
const file = (name: string, text: string) => {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
};
async function run(...argv: string[]) {
  let out = '';
  let err = '';
  const code = await runCli(argv, { stdout: (t) => (out += `${t}\n`), stderr: (t) => (err += `${t}\n`) });
  return { code, out, err };
}

const HEADER =
  'site;time zone;region;process;owner;context;monthly volume;cost per defective;currency;characteristic;unit;data kind;lsl;target;usl;risk class';
// An invented list, in the semicolon-and-decimal-comma dialect of many European spreadsheets.
const GOOD = [
  HEADER,
  'Werk Nord;Europe/Berlin;Nord;Drehen — Zelle 2;K. Braun;vehicle-parts;20000;1,25;EUR;Durchmesser;mm;measured;24,98;24,99;25,00;key',
  'Werk Nord;Europe/Berlin;Nord;Drehen — Zelle 2;K. Braun;vehicle-parts;20000;1,25;EUR;Rundlauf;mm;measured;;;0,02;standard',
  'Werk Süd;Europe/Vienna;Süd;Etikettieren;L. Haas;Packaged goods, net content;90000;0,4;EUR;Fehletiketten;;counted;;;;standard'
].join('\n');

describe('capstan portfolio', () => {
  it('turns a master list into an exchange file that check accepts and rank reads (";" and decimal commas detected)', async () => {
    const out = join(dir, 'setup.capstan.json');
    const r = await run('portfolio', file('good.csv', GOOD), '-o', out, '--from', '2026-11', '--json');
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const summary = JSON.parse(r.out);
    expect(summary).toMatchObject({
      written: true,
      delimiter: ';',
      decimal: ',',
      counts: { newSites: 2, newProcesses: 2, newCharacteristics: 3, badRows: 0 }
    });
    const check = await run('check', out, '--json');
    expect(check.code).toBe(0);
    expect(JSON.parse(check.out).counts).toMatchObject({
      sites: { records: 2 },
      processes: { records: 2 },
      characteristics: { records: 3 }
    });
    const rank = await run('rank', out, '--period', '2026-10', '--json');
    expect(rank.code).toBe(0);
    expect(JSON.parse(rank.out).rows).toHaveLength(2);
  });

  it('names every bad line with its reason, exits 2 and writes nothing', async () => {
    const out = join(dir, 'never.capstan.json');
    const bad = [
      HEADER,
      // 2: LSL above USL
      'Werk Nord;Europe/Berlin;;Drehen;;vehicle-parts;100;1;EUR;Breite;mm;measured;2,6;;2,4;standard',
      // 3: unknown risk class and unknown context
      'Werk Nord;Europe/Berlin;;Fräsen;;space-travel;100;1;EUR;Höhe;mm;measured;1;;2;critical',
      // 4: missing characteristic name
      'Werk Nord;Europe/Berlin;;Drehen;;vehicle-parts;100;1;EUR;;mm;measured;1;;2;standard',
      // 5 and 6: the same characteristic twice in one process
      'Werk Nord;Europe/Berlin;;Bohren;;vehicle-parts;100;1;EUR;Tiefe;mm;measured;1;;2;standard',
      'Werk Nord;Europe/Berlin;;Bohren;;vehicle-parts;100;1;EUR;Tiefe;mm;measured;1;;2;standard'
    ].join('\n');
    const r = await run('portfolio', file('bad.csv', bad), '-o', out);
    expect(r.code).toBe(2);
    expect(existsSync(out)).toBe(false);
    expect(r.err).toMatch(/4 bad rows in bad\.csv; nothing was written/);
    expect(r.err).toMatch(/line 2: .*USL \(2\.4\) must be greater than LSL \(2\.6\)/);
    expect(r.err).toMatch(/line 3: .*'space-travel' is not a known industry context/);
    expect(r.err).toMatch(/line 3: .*risk class: 'critical'/);
    expect(r.err).toMatch(/line 4: .*name/i);
    expect(r.err).toMatch(/line 6: .*appears twice in process 'Bohren' \(also line 5\)/);
    expect(r.err).not.toMatch(/line 5:/);
  });

  it('takes the separator and decimal mark from --delimiter and --decimal when given', async () => {
    const tab = GOOD.replaceAll(';', '\t');
    const out = join(dir, 'tab.capstan.json');
    const r = await run('portfolio', file('tab.tsv', tab), '-o', out, '--delimiter', 'tab', '--decimal', ',');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/2 sites, 2 processes, 3 characteristics \(separator tab, decimal mark ','\)/);
    // Read with the wrong decimal mark, the limits are no numbers: bad rows, not silent nonsense.
    const wrong = await run(
      'portfolio',
      file('good2.csv', GOOD),
      '-o',
      join(dir, 'x.json'),
      '--decimal',
      '.'
    );
    expect(wrong.code).toBe(2);
    expect(wrong.err).toMatch(/lsl: '24,98' is not a number/);
  });

  it('refuses a list without the required columns, saying which', async () => {
    const r = await run('portfolio', file('cols.csv', 'site,process\nA,B\n'), '-o', join(dir, 'y.json'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/no column for characteristic, dataKind/);
  });
});
