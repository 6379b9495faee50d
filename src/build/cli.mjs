/**
 * `npm run cli -- …`: runs the command line from one compiled JavaScript file, so that it starts at once instead
 * of compiling TypeScript at every call. The file is built with esbuild (already the compiler under tsx and
 * Vite; one bundle of src/cli/main.ts and what it imports) into node_modules/.cache/capstan-cli/, and rebuilt
 * when any source under src/ is newer than it — a checkout, an edit — so it is never stale.
 */
import { mkdirSync, readdirSync, renameSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const out = join(root, 'node_modules/.cache/capstan-cli/capstan.mjs');

function newestSource(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(full));
    else if (entry.name.endsWith('.ts')) newest = Math.max(newest, statSync(full).mtimeMs);
  }
  return newest;
}

function builtAt() {
  try {
    return statSync(out).mtimeMs;
  } catch {
    return 0;
  }
}

const sources = ['src/cli', 'src/lib/stats', 'src/lib/domain', 'src/lib/exchange', 'src/lib/spreadsheet'];
if (sources.some((s) => newestSource(join(root, s)) > builtAt())) {
  const { build } = await import('esbuild');
  mkdirSync(dirname(out), { recursive: true });
  await build({
    entryPoints: [join(root, 'src/cli/main.ts')],
    // Written under a name of its own, then renamed: a second call starting meanwhile never reads half a file.
    outfile: `${out}.${process.pid}.tmp`,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    // jStat and Papa Parse are CommonJS: give the bundle a `require` of its own.
    banner: { js: "import { createRequire as __capstanRequire } from 'node:module'; const require = __capstanRequire(import.meta.url);" },
    logLevel: 'error'
  });
  renameSync(`${out}.${process.pid}.tmp`, out);
}
await import(pathToFileURL(out).href);
