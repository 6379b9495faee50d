/**
 * The command line as a user runs it (`npm run -s cli -- …`, a new process each time): how fast it starts,
 * beside `npm run env` (npm's own start, the least any npm script costs); and `rank` and `check` of a
 * 2 000-process exchange file, beside a Node process that only reads and JSON.parses the same file. Medians of
 * five runs. Prints only.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
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
        name: '`check` of a 2 000-process exchange file (72 000 studies)',
        ms: check,
        ...parseBase,
        target: '≤ 2.5×'
      },
      { name: '`rank` of the same file', ms: rank, ...parseBase, target: '≤ 2.5×' }
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
