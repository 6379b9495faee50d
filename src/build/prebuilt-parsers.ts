import { build } from 'esbuild';
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { Plugin } from 'vite';
import type { GeneratedParserSource } from '../lib/exchange/generated-parser';

/** The module the app imports the parsers from. */
export const PREBUILT_PARSERS_MODULE = 'virtual:capstan-prebuilt-parsers';

/** The schemas whose parsers are built ahead of time: the ones a browser host prepares (exchange-host.ts). */
const SCHEMAS = [{ module: 'src/lib/exchange/exchange-schema.ts', name: 'exchangeFileSchema' }];

const root = fileURLToPath(new URL('../..', import.meta.url));

/**
 * Generates each schema's parser in Node: the schemas' modules bundled by esbuild (zod left to Node to load, so
 * the schemas and the compiler share one zod) and run from a file of their own.
 */
async function generatedSources(): Promise<(GeneratedParserSource & { key: string })[]> {
  const imports = SCHEMAS.map(
    (s, i) => `import { ${s.name} as schema${i} } from ${JSON.stringify(join(root, s.module))};`
  ).join('\n');
  const entry = `${imports}
import { generatedParserKey, generatedParserSources } from ${JSON.stringify(join(root, 'src/lib/exchange/generated-parser.ts'))};
export const sources = [${SCHEMAS.map((_, i) => `schema${i}`).join(', ')}]
  .flatMap((schema) => generatedParserSources(schema))
  .map((source) => ({ ...source, key: generatedParserKey(source) }));
`;
  const bundled = await build({
    stdin: { contents: entry, resolveDir: root, loader: 'ts' },
    bundle: true,
    format: 'esm',
    platform: 'node',
    external: ['zod', 'zod/*'],
    write: false,
    logLevel: 'silent'
  });
  // Beside node_modules, where `zod` resolves; one file per call, gone once loaded.
  const dir = join(root, 'node_modules/.cache/capstan-prebuilt-parsers');
  mkdirSync(dir, { recursive: true });
  const file = join(dir, `generate-${process.pid}-${Date.now()}.mjs`);
  writeFileSync(file, bundled.outputFiles[0]!.text);
  try {
    const loaded = (await import(pathToFileURL(file).href)) as {
      sources: (GeneratedParserSource & { key: string })[];
    };
    return loaded.sources;
  } finally {
    rmSync(file, { force: true });
  }
}

/**
 * Provides `virtual:capstan-prebuilt-parsers`: the parsers zod generates for the schemas above, written into the
 * bundle as plain functions, so that the browser, whose Content-Security-Policy forbids `new Function`, runs
 * zod's compiled parser all the same (src/lib/exchange/generated-parser.ts says how they are found and used).
 * Generated at every build and test run from the schemas as they are, so never stale.
 */
export function prebuiltParsers(): Plugin {
  const resolved = `\0${PREBUILT_PARSERS_MODULE}`;
  return {
    name: 'capstan-prebuilt-parsers',
    resolveId: (id) => (id === PREBUILT_PARSERS_MODULE ? resolved : undefined),
    async load(id) {
      if (id !== resolved) return undefined;
      const written = new Map<string, string>();
      for (const { key, parameters, body } of await generatedSources())
        written.set(key, `  [${JSON.stringify(key)}, function (${parameters.join(', ')}) {\n${body}\n}]`);
      const entries = [...written.values()];
      return `// zod's generated parsers, written by the build (src/build/prebuilt-parsers.ts).\nexport const prebuiltParsers = new Map([\n${entries.join(',\n')}\n]);\n`;
    }
  };
}
