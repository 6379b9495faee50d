import { execFile, execFileSync, spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cliNodeArguments } from '../../tests/support/cli-node-arguments';
import { checkValues, expectAbsolute, furnaceThickness } from '../../tests/support/reference-data';
import { canonicalJson } from '../lib/domain/canonical-json';
import { runCli } from './run-cli';

const dir = mkdtempSync(join(tmpdir(), 'capstan-cli-'));
function file(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

async function run(...argv: string[]) {
  let out = '';
  let err = '';
  const code = await runCli(argv, { stdout: (t) => (out += `${t}\n`), stderr: (t) => (err += `${t}\n`) });
  return { code, out, err };
}

const furnaceCsv = file('furnace.csv', `thickness\n${furnaceThickness().join('\n')}\n`);
const pub = checkValues().furnace_case_study.published;

describe('capstan analyze', () => {
  it('prints the figures as JSON with the documented keys (furnace case study, NIST e-Handbook)', async () => {
    const r = await run(
      'analyze',
      furnaceCsv,
      '--lsl',
      '460',
      '--usl',
      '660',
      '--target',
      '560',
      '--model',
      'normal',
      '--json'
    );
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    for (const key of [
      'n',
      'mean',
      'sdWithin',
      'sdOverall',
      'cp',
      'cpk',
      'pp',
      'ppk',
      'cpm',
      'ppmBelow',
      'ppmAbove',
      'ppmTotal',
      'ppmObserved',
      'yield',
      'zLevel',
      'model',
      'assumptions',
      'warnings',
      'intervals',
      'normality',
      'stability'
    ]) {
      expect(j, key).toHaveProperty(key);
    }
    expectAbsolute(j.pp, pub.CP, 5e-6);
    expectAbsolute(j.intervals.ppk.lower, pub.CPK_95ci[0], 5e-6);
    expect(j.normality).toHaveProperty('ad');
    expect(j.normality).toHaveProperty('p');
    expect(j).not.toHaveProperty('probabilityPlot');
  });

  it('reads semicolons and decimal commas, with subgroups from a column', async () => {
    const rows = Array.from(
      { length: 30 },
      (_, i) => `${Math.floor(i / 5) + 1};${(10 + ((i * 37) % 11) / 100).toFixed(2).replace('.', ',')}`
    );
    const path = file('eu.csv', `Gruppe;Durchmesser\n${rows.join('\n')}\n`);
    const r = await run(
      'analyze',
      path,
      '--lsl',
      '9.9',
      '--usl',
      '10.2',
      '--subgroup-column',
      'Gruppe',
      '--column',
      'Durchmesser',
      '--json'
    );
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.n).toBe(30);
    expect(j.sigmaEstimator).toBe('rbar');
    expect(j.mean).toBeGreaterThan(10);
    expect(j.mean).toBeLessThan(10.11);
  });

  it('has a readable table by default, with the assumptions', async () => {
    const r = await run('analyze', furnaceCsv, '--lsl', '460', '--usl', '660', '--min-index', '1.33');
    expect(r.code).toBe(0);
    // The table writes by the figure policy: Ppk 1.27327 (NIST e-Handbook furnace case; the JSON test above
    // checks it at full precision) to 2 decimals, the mean of whole-number data to one decimal.
    expect(r.out).toMatch(/Ppk\s+1\.27\s/);
    expect(r.out).toMatch(/mean\s+563\.0\n/);
    expect(r.out).not.toMatch(/\d[eE][+-]?\d/);
    expect(r.out).toMatch(/assumptions:/);
    expect(r.out).toMatch(/with 95 % confidence/);
  });

  it.each([
    [['analyze', join(dir, 'missing.csv'), '--lsl', '1'], /Cannot read '.*missing\.csv'/],
    [
      ['analyze', furnaceCsv, '--lsl', '700', '--usl', '600'],
      /--lsl \(700\) must be less than --usl \(600\)/
    ],
    [['analyze', furnaceCsv], /at least one limit/],
    [
      ['analyze', file('bad.csv', 'value\n1.5\n2.5\nabc\n'), '--usl', '3'],
      /Line 4, column 1 \('value'\): 'abc' is not a number/
    ],
    [['analyze', file('one.csv', 'value\n1.5\n'), '--usl', '3'], /holds 1 value; at least 2/],
    [['analyze', furnaceCsv, '--usl', '700', '--model', 'magic'], /--model must be one of/],
    [
      ['analyze', file('flat.csv', 'value\n5\n5\n5\n5\n'), '--usl', '6', '--model', 'normal'],
      /The normal model cannot be used: all 4 values are identical/
    ],
    [['analyze', furnaceCsv, '--usl', '700', '--colour', 'red'], /has no option --colour/],
    [
      ['counts', '--units', '10', '--defects', '50', '--opportunities', '4'],
      /Defects \(50\) cannot exceed the opportunities \(10 × 4 = 40\)/
    ],
    [['counts', '--units', '10', '--defectives', '11'], /cannot exceed units inspected/],
    [['counts', '--units', '10'], /either --defectives D or --defects D/],
    [['convert', '--ppm', '5', '--z', '3'], /exactly one of/],
    [['convert', '--yield', '150'], /fraction \(0\.9973\) or a percent/],
    [['explode'], /Unknown command 'explode'/]
  ])('bad input %j: exit 2 with one clear line on stderr', async (argv, message) => {
    const r = await run(...(argv as string[]));
    expect(r.code).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(message as RegExp);
    expect(r.out).toBe('');
  });
});

describe('capstan counts and convert', () => {
  it('counts defectives with the Clopper–Pearson interval (R binom.test x = 9, n = 24)', async () => {
    const j = JSON.parse((await run('counts', '--units', '24', '--defectives', '9', '--json')).out);
    expect(j.p).toBe(0.375);
    expectAbsolute(j.intervals.p.lower, 0.1879929, 5e-8);
    expectAbsolute(j.intervals.p.upper, 0.5940636, 5e-8);
    for (const key of ['p', 'ppm', 'yield', 'zLevel', 'intervals']) expect(j).toHaveProperty(key);
  });

  it('counts defects per opportunity', async () => {
    const j = JSON.parse(
      (await run('counts', '--units', '1000', '--defects', '6', '--opportunities', '3', '--json')).out
    );
    expect(j.dpu).toBe(0.006);
    expect(j.dpmo).toBe(2000);
    for (const key of ['dpu', 'dpmo', 'ppm', 'yield', 'zLevel', 'intervals']) expect(j).toHaveProperty(key);
  });

  it('converts with and without the shift (common practice: 3.4 ppm ↔ 4.5 ↔ 6.0)', async () => {
    const a = JSON.parse((await run('convert', '--ppm', '3.4', '--shift', '1.5', '--json')).out);
    expectAbsolute(a.zLevel, 4.5, 5e-4);
    expectAbsolute(a.zLevelShortTerm, 6, 5e-4);
    const b = JSON.parse((await run('convert', '--z', '6', '--shift', '1.5', '--json')).out);
    expectAbsolute(b.ppm, 3.4, 0.005);
    const c = JSON.parse((await run('convert', '--yield', '99.73%', '--json')).out);
    expectAbsolute(c.zLevel, 2.78, 0.005);
  });

  it('runs as `npm run -s cli` in a real process with its exit codes', () => {
    const ok = execFileSync('npm', ['run', '-s', 'cli', '--', 'convert', '--ppm', '66807', '--json'], {
      encoding: 'utf8'
    });
    expectAbsolute(JSON.parse(ok).zLevel, 1.5, 1e-5);
    const bad = spawnSync('npm', ['run', '-s', 'cli', '--', 'counts', '--units', 'x', '--defects', '1'], {
      encoding: 'utf8'
    });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--units must be a number, got 'x'/);
  });

  it('stops quietly when the reader closes the pipe early (`… | head`): no stack trace, exit 0', () => {
    // `true` exits at once, so every write of the ranking meets a closed pipe (EPIPE).
    const piped = spawnSync(
      'bash',
      [
        '-c',
        'npm run -s cli -- rank seed-data/demo-portfolio.json --json | true; echo "status ${PIPESTATUS[0]}"'
      ],
      { encoding: 'utf8', cwd: new URL('../..', import.meta.url).pathname }
    );
    expect(piped.stderr).toBe('');
    expect(piped.stdout.trim()).toBe('status 0');
  });
});

describe('capstan rank', () => {
  const demoFile = new URL('../../seed-data/demo-portfolio.json', import.meta.url).pathname;

  it('ranks the demo portfolio with the same rows and order as the ranking module', async () => {
    const { rankPortfolio } = await import('../lib/domain/portfolio-ranking');
    const { BUILT_IN_PROFILES } = await import('../lib/domain/context-profile');
    const { parseDemoPortfolio } = await import('../lib/domain/demo-portfolio-schema');
    const { readFileSync } = await import('node:fs');
    const r = await run('rank', demoFile, '--quarter', '2026-Q3', '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.endPeriod).toBe('2026-09');
    expect(j.windowMonths).toBe(3);
    const records = parseDemoPortfolio(JSON.parse(readFileSync(demoFile, 'utf8'))).records;
    const direct = rankPortfolio(records, BUILT_IN_PROFILES, { endPeriod: '2026-09', windowMonths: 3 });
    expect(j.rows.map((x: { process: string }) => x.process)).toEqual(direct.map((x) => x.process.name));
  });

  it('prints the table in the JSON rows’ order, with their status (the table is ranked without trend lines)', async () => {
    const table = await run('rank', demoFile, '--quarter', '2026-Q3');
    const json = JSON.parse((await run('rank', demoFile, '--quarter', '2026-Q3', '--json')).out) as {
      rows: { process: string; status: string }[];
    };
    expect(table.code).toBe(0);
    // The rows of the table: after its header, up to the blank line before the caution.
    const lines = table.out.split('\n');
    const header = lines.findIndex((l) => l.startsWith('#\t'));
    const body = lines.slice(header + 1, lines.indexOf('', header + 1)).map((l) => l.split('\t'));
    expect(body).toHaveLength(json.rows.length);
    const at = (name: string) => lines[header]!.split('\t').findIndex((h) => h.toLowerCase().includes(name));
    body.forEach((cells, i) => {
      const row = json.rows[i]!;
      expect(cells[at('process')]).toBe(row.process);
      expect(cells[at('status')]).toBe(row.status);
    });
    expect(json.rows.length).toBeGreaterThan(20);
  });

  it.each([
    [['rank'], /needs a portfolio file/],
    [['rank', '/nonexistent.json'], /Cannot read/],
    [['rank', furnaceCsv], /is not JSON/],
    [['rank', file('other.json', '{"kind":"other"}')], /is not a portfolio file: kind/],
    [['rank', furnaceCsv, '--quarter', '2026-Q9'], /--quarter must be written YYYY-Qn/]
  ])('bad input %j: exit 2 with one line', async (argv, message) => {
    const r = await run(...(argv as string[]));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(message as RegExp);
  });
});

describe('capstan reading a path that is not a file', () => {
  it('refuses a folder and a missing file with one line and exit 2, never a stack trace', async () => {
    for (const command of ['check', 'rank', 'merge']) {
      const args = command === 'merge' ? [dir, dir, '-o', join(dir, 'out.json')] : [dir];
      const r = await run(command, ...args);
      expect(r.code).toBe(2);
      expect(r.err.trim()).toBe(`capstan ${command}: '${dir}' is a folder, not a file`);
    }
    const missing = join(dir, 'no-such-file.capstan.json');
    for (const command of ['check', 'rank']) {
      const r = await run(command, missing);
      expect(r.code).toBe(2);
      expect(r.err.trim()).toBe(`capstan ${command}: Cannot read '${missing}': no such file or not readable`);
    }
  });
});

describe('capstan check and merge', async () => {
  const { readFileSync, existsSync } = await import('node:fs');
  const { changeSetOf, encodeExchangeFile, decodeExchangeFile } =
    await import('../lib/exchange/exchange-file');
  const { stampNew, stampUpdate } = await import('../lib/domain/record-meta');
  const { demoRecordSet, testFileHeader: header } = await import('../../tests/support/demo-change-set');
  const demoJson = JSON.parse(
    readFileSync(new URL('../../seed-data/demo-portfolio.json', import.meta.url), 'utf8')
  );
  const base = demoRecordSet(Date.now());
  const writeSet = async (name: string, records: typeof base, gzip = false) => {
    const path = join(dir, name);
    writeFileSync(path, await encodeExchangeFile(changeSetOf(header(name), records), { gzip }));
    return path;
  };
  const renamed = (deviceId: string, at: string, name: string) => {
    const site = base.sites[0]!;
    const {
      id: _i,
      createdAt: _c,
      updatedAt: _u,
      rev: _r,
      deviceId: _d,
      vv: _v,
      clock: _k,
      ...fields
    } = site;
    const ctx = { deviceId, now: () => new Date(at), newId: () => 'unused' };
    return { ...base, sites: [stampUpdate(site, { ...fields, name }, ctx), ...base.sites.slice(1)] };
  };
  const basePath = await writeSet('base.capstan.json', base);
  const hqPath = await writeSet(
    'hq.capstan.json.gz',
    renamed('hq', '2026-11-02T00:00:00Z', 'Renamed at HQ'),
    true
  );
  const sitePath = await writeSet(
    'site.capstan.json',
    renamed('site', '2026-11-03T00:00:00Z', 'Renamed at the site')
  );

  it('check prints the header and counts of a valid file, compressed or not', async () => {
    const r = await run('check', hqPath);
    expect(r.code).toBe(0);
    expect(r.out).toContain('valid Capstan exchange file (format version 1, content hash verified)');
    expect(r.out).toMatch(new RegExp(`studies\\s+${base.studies.length}\\s+\\(0 deleted\\)`));
    const j = JSON.parse((await run('check', basePath, '--json')).out);
    expect(j.header.exportedBy.deviceName).toBe('base.capstan.json');
    expect(j.counts.sites).toEqual({ records: 5, deleted: 0 });
  });

  it.each([
    ['hash-mismatch.capstan.json', /content hash does not match/],
    ['future-version.capstan.json', /newer Capstan/],
    ['csv-renamed.capstan.json', /CSV table/]
  ])('check refuses %s with exit 2 and one line', async (name, message) => {
    const path = new URL(`../../tests/fixtures/bad-exchange-files/${name}`, import.meta.url).pathname;
    const r = await run('check', path);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(message);
    expect(r.err.trim().split('\n')).toHaveLength(1);
  });

  it('merge takes a descendant without asking and counts it', async () => {
    const out = join(dir, 'merged-1.capstan.json');
    const r = await run('merge', basePath, hqPath, '-o', out);
    expect(r.code).toBe(0);
    expect(r.out).toContain(
      `1 updated, ${base.studies.length + 42 + 32 + 4 + 8} unchanged, 0 deleted, 0 conflicting`
    );
    const merged = await decodeExchangeFile(new Uint8Array(readFileSync(out)));
    expect(merged.records.sites.find((s) => s.id === base.sites[0]!.id)?.name).toBe('Renamed at HQ');
    expect(merged.header.scope).toEqual({
      kind: 'merged',
      sources: ['base.capstan.json', 'hq.capstan.json.gz']
    });
  });

  it('merge stops at a conflict with exit 3 and writes nothing, unless told which side to prefer', async () => {
    const out = join(dir, 'merged-2.capstan.json');
    const r = await run('merge', sitePath, hqPath, '-o', out, '--json');
    expect(r.code).toBe(3);
    const j = JSON.parse(r.out);
    expect(j.written).toBe(false);
    expect(j.conflicts).toEqual([
      {
        kind: 'sites',
        id: base.sites[0]!.id,
        type: 'record',
        nature: 'both-edited',
        fields: ['name'],
        title: 'Site “Renamed at the site”',
        question: 'Edited on both devices since they last exchanged files.'
      }
    ]);
    expect(existsSync(out)).toBe(false);
    for (const [prefer, name] of [
      ['newer', 'Renamed at the site'],
      ['base', 'Renamed at the site'],
      ['incoming', 'Renamed at HQ']
    ]) {
      const ok = await run('merge', sitePath, hqPath, '-o', out, '--prefer', prefer!);
      expect(ok.code).toBe(0);
      expect(ok.out).toContain(`1 conflicting (settled: ${prefer})`);
      const merged = await decodeExchangeFile(new Uint8Array(readFileSync(out)));
      expect(merged.records.sites.find((s) => s.id === base.sites[0]!.id)?.name).toBe(name);
    }
    expect((await run('merge', sitePath, hqPath, '-o', out, '--prefer', 'mine')).err).toMatch(
      /--prefer must be newer, base or incoming/
    );
  });

  it('merge treats one month logged in both files as a conflict (exit 3), and --prefer leaves one study', async () => {
    const measured = base.characteristics.find((c) => c.dataKind === 'measured')!;
    const logged = async (deviceId: string, mean: number, name: string) => {
      const ctx = { deviceId, now: () => new Date('2026-11-20T10:00:00Z'), newId: () => crypto.randomUUID() };
      const study = stampNew(
        {
          characteristicId: measured.id,
          period: '2020-01',
          data: { kind: 'summary' as const, n: 30, mean, sd: 0.1 },
          enteredBy: deviceId
        },
        ctx
      );
      return writeSet(name, { ...base, studies: [...base.studies, study] });
    };
    const a = await logged('office', 10, 'month-a.capstan.json');
    const b = await logged('site-lead', 10.2, 'month-b.capstan.json');
    const out = join(dir, 'month-merged.capstan.json');
    const stop = await run('merge', a, b, '-o', out);
    expect(stop.code).toBe(3);
    expect(stop.out).toMatch(/This month was logged on both devices/);
    expect(existsSync(out)).toBe(false);
    const ok = await run('merge', a, b, '-o', out, '--prefer', 'incoming');
    expect(ok.code).toBe(0);
    const merged = await decodeExchangeFile(new Uint8Array(readFileSync(out)));
    const live = merged.records.studies.filter((x) => x.period === '2020-01' && !x.deletedAt);
    expect(live).toHaveLength(1);
    expect(live[0]!.data).toMatchObject({ mean: 10.2 });
    expect((await run('check', out)).code).toBe(0);
  });

  describe('gather', () => {
    let folders = 0;
    /** A folder as a sync service leaves it: device files, files still being written, a note, a cut-off file. */
    const folderWith = (files: Record<string, string | Uint8Array>) => {
      folders += 1;
      const path = join(dir, `shared-${folders}`);
      mkdirSync(path);
      for (const [name, content] of Object.entries(files)) {
        if (typeof content === 'string') copyFileSync(content, join(path, name));
        else writeFileSync(join(path, name), content);
      }
      return path;
    };
    const recordsIn = async (path: string) =>
      (await decodeExchangeFile(new Uint8Array(readFileSync(path)))).records;

    it('merges every exchange file, skips names still being written, names a damaged file and exits 0', async () => {
      const whole = readFileSync(hqPath);
      const folder = folderWith({
        'base.capstan.json': basePath,
        'hq.capstan.json.gz': hqPath,
        '.syncthing.site.capstan.json.tmp': whole.subarray(0, 50),
        '~syncthing~site.capstan.json.tmp': whole.subarray(0, 50),
        'site.capstan.json.part': whole.subarray(0, 50),
        'notes.txt': new TextEncoder().encode('not an exchange file'),
        'cut-off.capstan.json.gz': whole.subarray(0, whole.length - 30),
        // Refused before it is read, while the file before it is checked: named in its turn all the same.
        'empty.capstan.json': new Uint8Array(0)
      });
      const out = join(folder, 'office.capstan.json');
      const r = await run('gather', folder, '-o', out);
      expect(r.code).toBe(0);
      expect(r.err.trim().split('\n')).toEqual([
        expect.stringMatching(/^capstan gather: skipped 'cut-off\.capstan\.json\.gz': /),
        "capstan gather: skipped 'empty.capstan.json': The file is empty (0 bytes): nothing to import"
      ]);
      expect(r.out).toMatch(/from 2 files, 2 damaged files skipped/);
      const merged = await recordsIn(out);
      expect(merged.sites.find((x) => x.id === base.sites[0]!.id)?.name).toBe('Renamed at HQ');
      expect(merged.studies).toHaveLength(base.studies.length);
      expect(readdirSync(folder).filter((n) => n.startsWith('.office'))).toEqual([]);
      expect((await run('check', out)).code).toBe(0);

      // Gathering again with its own output in the folder changes no record.
      const again = await run('gather', folder, '-o', out);
      expect(again.code).toBe(0);
      expect(canonicalJson(await recordsIn(out))).toBe(canonicalJson(merged));

      // --strict: a damaged file stops it, with exit 2 and nothing written.
      const strictOut = join(dir, 'strict.capstan.json');
      const strict = await run('gather', folder, '-o', strictOut, '--strict');
      expect(strict.code).toBe(2);
      expect(strict.err).toMatch(/--strict given: nothing was written/);
      expect(existsSync(strictOut)).toBe(false);
    });

    it('stops at conflicts with exit 3 and writes nothing; --prefer settles them; a conflict copy is read like any file', async () => {
      const folder = folderWith({
        'base.capstan.json': basePath,
        'hq.capstan.json.gz': hqPath,
        'site.capstan.json.sync-conflict-20261203-101010-ABCDEFG.json': sitePath
      });
      const out = join(dir, 'gathered-conflict.capstan.json');
      const stop = await run('gather', folder, '-o', out, '--json');
      expect(stop.code).toBe(3);
      const j = JSON.parse(stop.out);
      expect(j.written).toBe(false);
      expect(j.conflicts.map((c: { id: string; type: string }) => [c.id, c.type])).toEqual([
        [base.sites[0]!.id, 'record']
      ]);
      expect(existsSync(out)).toBe(false);
      const ok = await run('gather', folder, '-o', out, '--prefer', 'newer');
      expect(ok.code).toBe(0);
      expect(ok.out).toMatch(/1 conflict settled: newer/);
      expect((await recordsIn(out)).sites.find((x) => x.id === base.sites[0]!.id)?.name).toBe(
        'Renamed at the site'
      );
      // The settled file in the folder ends the conflict for everyone: gathering again asks nothing.
      copyFileSync(out, join(folder, 'office.capstan.json'));
      expect((await run('gather', folder, '-o', join(dir, 'after-settle.capstan.json'))).code).toBe(0);
    });

    it('refuses an empty folder, a missing one and a wrong option with exit 2 and one line', async () => {
      const empty = folderWith({ 'notes.txt': new TextEncoder().encode('x') });
      const r = await run('gather', empty, '-o', join(dir, 'never.capstan.json'));
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/No exchange files in/);
      expect((await run('gather', join(dir, 'no-such-folder'), '-o', join(dir, 'x.json'))).err).toMatch(
        /Cannot read the folder/
      );
      expect((await run('gather', empty, '-o', join(dir, 'x.json'), '--prefer', 'mine')).code).toBe(2);
      expect((await run('gather', empty)).err).toMatch(/gather needs a folder and an output/);
    });
  });

  it('rank reads an exchange file and ranks it as the demo file', async () => {
    // The exchange file holds the demo dated from today: the same window, moved by the same months, gives the
    // same rows.
    const { addMonths } = await import('../lib/domain/period');
    const last = (studies: { period: string }[]) =>
      studies.reduce((a, x) => (x.period > a ? x.period : a), '');
    const index = (p: string) => Number(p.slice(0, 4)) * 12 + Number(p.slice(5, 7));
    const months = index(last(base.studies)) - index(last(demoJson.records.studies));
    const period = addMonths('2026-09', months);
    const fromExchange = JSON.parse(
      (await run('rank', basePath, '--period', period, '--window', '3', '--json')).out
    );
    const fromDemo = JSON.parse(
      (await run('rank', demoFile(), '--period', '2026-09', '--window', '3', '--json')).out
    );
    expect(fromExchange.rows).toEqual(fromDemo.rows);
  });

  it('rank reads an exchange file however it is laid out: as written, re-indented with a byte-order mark, or with its keys in another order', async () => {
    const written = readFileSync(basePath, 'utf8');
    const parsed = JSON.parse(written) as Record<string, unknown>;
    const indented = file('indented.capstan.json', `\uFEFF\n  ${JSON.stringify(parsed, null, 2)}\n`);
    const { format, ...rest } = parsed;
    const reordered = file('reordered.capstan.json', JSON.stringify({ ...rest, format }));
    const rows = async (path: string) => {
      const r = await run('rank', path, '--json');
      expect(r.code).toBe(0);
      return JSON.parse(r.out).rows as unknown[];
    };
    const expected = await rows(basePath);
    expect(expected.length).toBeGreaterThan(0);
    expect(await rows(indented)).toEqual(expected);
    expect(await rows(reordered)).toEqual(expected);
  });

  it('runs check and merge as `npm run -s cli` with exit codes 2 and 3', () => {
    const bad = spawnSync(
      'npm',
      [
        'run',
        '-s',
        'cli',
        '--',
        'check',
        new URL('../../tests/fixtures/bad-exchange-files/truncated.capstan.json', import.meta.url).pathname
      ],
      { encoding: 'utf8' }
    );
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/ends early/);
    const conflict = spawnSync(
      'npm',
      ['run', '-s', 'cli', '--', 'merge', sitePath, hqPath, '-o', join(dir, 'x.json')],
      {
        encoding: 'utf8'
      }
    );
    expect(conflict.status).toBe(3);
    expect(conflict.stdout).toMatch(/1 conflict:/);
  });

  it('check in a real process, its second thread counting keys and hashing, refuses every file of the bad-file corpus as the app does', async () => {
    const corpus = new URL('../../tests/fixtures/bad-exchange-files/', import.meta.url);
    const files = readdirSync(corpus).filter((f) => f.includes('.capstan.json'));
    const verdictHere = async (path: string) => {
      try {
        await decodeExchangeFile(new Uint8Array(readFileSync(path)));
        return 'valid';
      } catch (e) {
        return e instanceof Error ? e.message : String(e);
      }
    };
    const verdictThere = (path: string) =>
      new Promise<string>((resolve) => {
        // As the npm script starts it (package.json), without npm's own start.
        const node = execFile(
          process.execPath,
          [...cliNodeArguments(), 'check', path],
          { encoding: 'utf8' },
          (error, _out, err) => {
            const code = node.exitCode ?? (error ? 1 : 0);
            resolve(code === 0 ? 'valid' : err.trim().replace(`capstan check: '${path}': `, ''));
          }
        );
      });
    const paths = files.map((f) => new URL(f, corpus).pathname);
    const there: string[] = [];
    // Two at a time: the machine has two cores, and each command uses both.
    for (let i = 0; i < paths.length; i += 2)
      there.push(...(await Promise.all(paths.slice(i, i + 2).map(verdictThere))));
    const here = await Promise.all(paths.map(verdictHere));
    // A message that quotes this device's clock quotes each process's own moment.
    const withoutNow = (v: string) => v.replace(/against \d{4}-\d\d-\d\dT[\d:.]+Z/, 'against (now)');
    expect(there.map(withoutNow)).toEqual(here.map(withoutNow));
    expect(here.filter((v) => v === 'valid').length).toBeLessThan(here.length / 4);
  }, 60_000);
});

function demoFile() {
  return new URL('../../seed-data/demo-portfolio.json', import.meta.url).pathname;
}
