/**
 * The whole test command: every gate and suite in turn, then one closing line `N passed, N failed` that
 * totals them. Vitest and Playwright report their own counts (read from their JSON reports); each gate
 * (formatting, lint, type check, build, size budget) counts as one check. Every step runs even when an
 * earlier one failed, except those that need the build. Exit code 1 when anything failed.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const out = `${root}tests/e2e/.output`;
mkdirSync(out, { recursive: true });
const bin = (name) => `${root}node_modules/.bin/${name}`;

let passed = 0;
let failed = 0;
const lines = [];

function run(label, command, args, env = {}) {
  console.log(`\n=== ${label} ===`);
  const started = Date.now();
  const result = spawnSync(command, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  const ok = result.status === 0;
  lines.push(`${ok ? 'ok  ' : 'FAIL'} ${label} (${seconds} s)`);
  return ok;
}

function gate(label, command, args) {
  const ok = run(label, command, args);
  if (ok) passed += 1;
  else failed += 1;
  return ok;
}

function readJson(file) {
  try {
    return JSON.parse(readFileSync(file, 'utf8'));
  } catch {
    return undefined;
  }
}

gate('formatting (prettier)', bin('prettier'), ['--check', '.']);
gate('lint (eslint)', bin('eslint'), ['--config', '.config/eslint.config.js', '--max-warnings', '0', '.']);
gate('types (svelte-kit sync, svelte-check)', 'npm', ['run', 'check']);

const unitReport = `${out}/unit.json`;
rmSync(unitReport, { force: true });
const unitOk = run('unit tests (vitest)', bin('vitest'), [
  'run',
  '--reporter=default',
  '--reporter=json',
  `--outputFile=${unitReport}`
]);
const unit = readJson(unitReport);
if (unit) {
  passed += unit.numPassedTests;
  failed += unit.numFailedTests + (unitOk || unit.numFailedTests > 0 ? 0 : 1);
} else failed += 1;

const built = gate('build', 'npm', ['run', 'build']);
if (built) {
  gate('size budget (first-page JS, lazy charts, precache)', process.execPath, ['tests/bundle-budget.mjs']);
  const e2eReport = `${out}/results.json`;
  rmSync(e2eReport, { force: true });
  const e2eOk = run('browser tests (Playwright, Chromium)', bin('playwright'), [
    'test',
    '-c',
    'tests/e2e/playwright.config.ts'
  ]);
  const e2e = existsSync(e2eReport) ? readJson(e2eReport) : undefined;
  if (e2e?.stats) {
    passed += e2e.stats.expected + (e2e.stats.flaky ?? 0);
    failed += e2e.stats.unexpected + (e2eOk || e2e.stats.unexpected > 0 ? 0 : 1);
  } else failed += 1;
} else {
  console.log('\nThe build failed: the size budget and the browser tests could not run.');
  failed += 2;
}

console.log('\n=== summary ===');
for (const line of lines) console.log(line);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
