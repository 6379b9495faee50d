/**
 * The command line as a user runs it (`npm run -s cli -- …`, a new process each time): how fast it starts,
 * beside `npm run env` (npm's own start, the least any npm script costs); and `rank` and `check` of a
 * 2 000-process exchange file, beside a Node process that only reads and JSON.parses the same file — started by
 * node as that baseline is, and also through npm as a person types them. Medians of five runs. Prints only.
 *
 * `gather` of a shared folder: the same portfolio as 50 site devices' files (each site's records with the
 * targets, as each device holds them before any sync), beside a Node process that reads and JSON.parses the
 * 50 files.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { emptyRecords, parentIdOf, RECORD_KINDS } from '../../src/lib/domain/record-kinds';
import type { RecordMeta } from '../../src/lib/domain/record-meta';
import { changeSetOf, decodeExchangeFile, encodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { cliNodeArguments } from '../support/cli-node-arguments';
import { companyPortfolioFile } from './company-portfolio-file';
import type { BenchRow } from './engine-bench';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

function medianRun(command: string, args: string[], runs = 5): number {
  const times: number[] = [];
  for (let i = 0; i < runs + 1; i += 1) {
    const t = performance.now();
    const r = spawnSync(command, args, { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'], encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${command} ${args.join(' ')} failed: ${r.stderr.slice(-300)}`);
    if (i > 0) times.push(performance.now() - t); // the first run builds or warms caches
  }
  return times.sort((a, b) => a - b)[Math.floor(times.length / 2)]!;
}

/** The company file split into one file per site, as each site's device would write it. */
export async function writeSiteDeviceFiles(bytes: Uint8Array, folder: string): Promise<string[]> {
  const { header, records } = await decodeExchangeFile(bytes);
  const siteOf = new Map<string, string>();
  for (const site of records.sites) siteOf.set(site.id, site.id);
  for (const kind of RECORD_KINDS) {
    for (const r of records[kind] as RecordMeta[]) {
      const parent = parentIdOf(kind, r);
      if (parent !== undefined && siteOf.has(parent)) siteOf.set(r.id, siteOf.get(parent)!);
    }
  }
  const paths: string[] = [];
  for (const [i, site] of records.sites.entries()) {
    const own = emptyRecords() as unknown as Record<string, RecordMeta[]>;
    for (const kind of RECORD_KINDS) {
      own[kind] = (records[kind] as RecordMeta[]).filter(
        (r) => kind === 'contextProfiles' || siteOf.get(r.id) === site.id
      );
    }
    const name = `Works-${i + 1}-${String(i).padStart(8, '0')}.capstan.json`;
    const changeSet = changeSetOf(
      { ...header, exportedBy: { deviceId: `site-device-${i}`, deviceName: `Works ${i + 1}` } },
      own as never
    );
    writeFileSync(join(folder, name), await encodeExchangeFile(changeSet));
    paths.push(join(folder, name));
  }
  return paths;
}

export async function runCommandLineBench(): Promise<BenchRow[]> {
  const dir = mkdtempSync(join(tmpdir(), 'capstan-cli-bench-'));
  try {
    const file = join(dir, 'company.capstan.json');
    writeFileSync(file, await companyPortfolioFile(2000));
    const env = medianRun('npm', ['run', '-s', 'env']);
    const help = medianRun('npm', ['run', '-s', 'cli', '--', 'help']);
    const parse = medianRun(process.execPath, [
      '-e',
      `JSON.parse(require('fs').readFileSync(${JSON.stringify(file)}, 'utf8'))`
    ]);
    const check = medianRun('npm', ['run', '-s', 'cli', '--', 'check', file]);
    const rank = medianRun('npm', ['run', '-s', 'cli', '--', 'rank', file]);
    // The same commands started as the baseline is, by node itself, with the options the npm script gives it:
    // npm's own start (the start row's baseline) is the same for every command and is not the work of reading a
    // file.
    const checkByNode = medianRun(process.execPath, [...cliNodeArguments(), 'check', file]);
    const rankByNode = medianRun(process.execPath, [...cliNodeArguments(), 'rank', file]);
    const folder = join(dir, 'shared');
    mkdirSync(folder);
    const deviceFiles = await writeSiteDeviceFiles(readFileSync(file), folder);
    const parseAll = medianRun(process.execPath, [
      '-e',
      `for (const f of ${JSON.stringify(deviceFiles)}) JSON.parse(require('fs').readFileSync(f, 'utf8'))`
    ]);
    const gather = medianRun('npm', [
      'run',
      '-s',
      'cli',
      '--',
      'gather',
      folder,
      '-o',
      join(dir, 'gathered.json')
    ]);
    const parseBase = {
      baselineName: 'node reading and JSON.parse of the file',
      baselineMs: parse,
      size: 2000
    };
    return [
      {
        name: 'command line start (`help`)',
        ms: help,
        baselineName: '`npm run env`',
        baselineMs: env,
        target: '≤ 2×'
      },
      {
        name: `\`check\` of a 2 000-process exchange file (72 000 studies), \`node ${cliNodeArguments().join(' ')} check FILE\``,
        ms: checkByNode,
        ...parseBase,
        target: '≤ 2.5×'
      },
      {
        name: `\`rank\` of the same file, \`node ${cliNodeArguments().join(' ')} rank FILE\``,
        ms: rankByNode,
        ...parseBase,
        target: '≤ 2.5×'
      },
      {
        name: '  … `check` as `npm run -s cli -- check FILE` (npm starting adds what the start row measures)',
        ms: check,
        ...parseBase
      },
      { name: '  … `rank` as `npm run -s cli -- rank FILE`', ms: rank, ...parseBase },
      {
        name: "`gather` of 50 site devices' files of the same portfolio",
        ms: gather,
        baselineName: 'node reading and JSON.parse of the 50 files',
        baselineMs: parseAll,
        size: 2000,
        target: '≤ 3×'
      }
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
