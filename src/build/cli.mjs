/**
 * `npm run cli -- …`: runs the command line from compiled JavaScript, so that it starts at once instead of
 * compiling TypeScript at every call. It is built with esbuild (already the compiler under tsx and Vite; a bundle
 * of src/cli/main.ts and what it imports, and of the thread that takes an exchange file's written facts beside it
 * (src/cli/written-facts-worker.ts), split where the command line loads a command's module when it runs, so
 * that `help` loads none of them) into node_modules/.cache/capstan-cli/, and built again when any source under
 * src/ is newer than the last build — a checkout, an edit — so it is never stale.
 *
 * The npm script starts node with `--initial-old-space-size=512`: parsing a company's 30 MB exchange file grows
 * the heap past V8's first limit for old objects, which cost a full garbage collection in the middle of the
 * parse. `check` of the 2 000-process file: 769 ms with the option against 825 without (medians of nine
 * alternating runs, Node 20). The option only raises that first limit; memory is still taken as it is used.
 */
import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const cache = join(root, 'node_modules/.cache/capstan-cli');

function newestSource(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(full));
    // Tests are not built into the command line: editing one does not build it again, and is not looked at.
    else if (entry.name.endsWith('.ts') && !entry.name.endsWith('.spec.ts'))
      newest = Math.max(newest, statSync(full).mtimeMs);
  }
  return newest;
}

const sources = ['src/cli', 'src/lib/stats', 'src/lib/domain', 'src/lib/exchange', 'src/lib/spreadsheet'];
// One folder per state of the sources, named by the newest source's time: a build never changes a folder a
// running command may still load chunks from, and two calls starting together at worst both build it.
// This launcher counts as a source too: how it builds changes what is built.
const launcherMs = statSync(fileURLToPath(import.meta.url)).mtimeMs;
const build = join(
  cache,
  String(Math.round(Math.max(launcherMs, ...sources.map((s) => newestSource(join(root, s))))))
);
const entry = join(build, 'main.js');
/**
 * `zod` as the command line uses it: the namespace `z` of zod's classic schemas, checks, errors and parsing, without
 * the 60-odd locales, JSON Schema conversion and the rest of what `zod`'s index gathers. Rollup shakes those out of
 * the app (zod's index is written for it), but esbuild keeps every module a namespace object re-exports, so each
 * `check` and `rank` loaded and compiled 665 KB of zod. Its English messages come with the schemas (the classic
 * ZodType registers them when the first schema is built), so the messages are the same.
 */
const zodClassicOnly = {
  name: 'zod-classic-only',
  setup(build) {
    const classic = join(root, 'node_modules/zod/v4/classic');
    build.onResolve({ filter: /^zod$/ }, () => ({ path: 'zod', namespace: 'capstan-zod' }));
    build.onResolve({ filter: /^capstan-zod-members$/ }, () => ({ path: 'members', namespace: 'capstan-zod' }));
    build.onLoad({ filter: /^zod$/, namespace: 'capstan-zod' }, () => ({
      contents: "import * as z from 'capstan-zod-members';\nexport { z };\nexport * from 'capstan-zod-members';\n",
      resolveDir: classic
    }));
    build.onLoad({ filter: /^members$/, namespace: 'capstan-zod' }, () => ({
      contents: ['schemas', 'checks', 'errors', 'parse', 'compat']
        .map((m) => `export * from './${m}.js';\n`)
        .join(''),
      resolveDir: classic
    }));
  }
};

if (!existsSync(entry)) {
  const esbuild = await import('esbuild');
  const partial = `${build}.${process.pid}.tmp`;
  mkdirSync(cache, { recursive: true });
  await esbuild.build({
    entryPoints: [join(root, 'src/cli/main.ts'), join(root, 'src/cli/written-facts-worker.ts')],
    outdir: partial,
    bundle: true,
    splitting: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    // jStat and Papa Parse are CommonJS: give each file a `require` of its own.
    banner: { js: "import { createRequire as __capstanRequire } from 'node:module'; const require = __capstanRequire(import.meta.url);" },
    plugins: [zodClassicOnly],
    logLevel: 'error'
  });
  // Node looks for the package.json that says how to read a .js file no higher than node_modules, so it found none
  // for these chunks and compiled each first as CommonJS to detect that it is a module (Node 20.19 detects module
  // syntax by default). Said here, every chunk is compiled once: `check` of the 2 000-process file 582 against 603
  // ms (medians of eleven alternating runs of the same build with and without this file).
  writeFileSync(join(partial, 'package.json'), '{ "type": "module" }\n');
  try {
    renameSync(partial, build);
  } catch {
    // Another call finished the same build first: use it.
    rmSync(partial, { recursive: true, force: true });
  }
  // Builds of older sources, once no command can still be running from them.
  for (const old of readdirSync(cache))
    if (join(cache, old) !== build && Date.now() - statSync(join(cache, old)).mtimeMs > 3_600_000)
      rmSync(join(cache, old), { recursive: true, force: true });
}
await import(pathToFileURL(entry).href);
