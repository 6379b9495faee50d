import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

/**
 * Every layer rule of .config/eslint.config.js, proved open to nothing: a small probe file that breaks the rule is
 * linted as if it stood at the named place, and must give a layer-rule error. A probe that keeps to the rules
 * must give none (so the rules do not simply refuse everything).
 */
const eslint = new ESLint({ overrideConfigFile: '.config/eslint.config.js' });

async function layerErrors(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? []).filter((m) => m.ruleId === 'no-restricted-imports').map((m) => m.message);
}

const probes: [string, string, string][] = [
  [
    'stats → domain, two folders deep',
    'src/lib/stats/models/probe.ts',
    "import { addMonths } from '../../domain/period';"
  ],
  [
    'stats → storage through $lib',
    'src/lib/stats/probe.ts',
    "import type { CapstanStorage } from '$lib/storage/storage';"
  ],
  [
    'domain → storage',
    'src/lib/domain/probe.ts',
    "import type { CapstanDatabase } from '../storage/database';"
  ],
  [
    'domain → exchange',
    'src/lib/domain/probe.ts',
    "import { decodeExchangeFile } from '../exchange/exchange-file';"
  ],
  [
    'storage → exchange',
    'src/lib/storage/probe.ts',
    "import { decodeExchangeFile } from '../exchange/exchange-file';"
  ],
  ['storage → UI', 'src/lib/storage/probe.ts', "import { formatCount } from '../ui/format';"],
  [
    'exchange → the database',
    'src/lib/exchange/probe.ts',
    "import type { CapstanDatabase } from '../storage/database';"
  ],
  [
    'UI → the database, one folder deeper',
    'src/lib/ui/review/probe.ts',
    "import type { CapstanDatabase } from '../../storage/database';"
  ],
  [
    'UI → the database through $lib',
    'src/lib/ui/probe.ts',
    "import type { CapstanDatabase } from '$lib/storage/database';"
  ],
  ['UI → databaseOf', 'src/lib/ui/probe.ts', "import { databaseOf } from '../storage/storage';"],
  [
    'page → the database',
    'src/routes/probe/+page.ts',
    "import { CapstanDatabase } from '$lib/storage/database';"
  ],
  ['page → Dexie', 'src/routes/probe.ts', "import { Dexie } from 'dexie';"],
  [
    'command line → browser storage',
    'src/cli/probe.ts',
    "import { openStorage } from '../lib/storage/storage';"
  ],
  ['command line → UI', 'src/cli/probe.ts', "import { formatCount } from '../lib/ui/format';"],
  [
    'worker → storage',
    'src/lib/workers/probe.worker.ts',
    "import { openStorage } from '../storage/storage';"
  ],
  ['worker → Dexie', 'src/lib/workers/probe.worker.ts', "import { Dexie } from 'dexie';"],
  [
    'exchange worker → the database class',
    'src/lib/workers/exchange-file.worker.ts',
    "import { CapstanDatabase } from '../storage/database';"
  ],
  [
    'exchange worker → a repository module',
    'src/lib/workers/exchange-file.worker.ts',
    "import { applyChangeSet } from '../storage/change-set-store';"
  ],
  [
    'worker → the database class',
    'src/lib/workers/probe.worker.ts',
    "import { CapstanDatabase } from '$lib/storage/database';"
  ]
];

describe('layer rules hold at any depth and through $lib', () => {
  it.each(probes)('refuses %s', async (_name, filePath, code) => {
    const errors = await layerErrors(filePath, `${code}\nexport const probe = 1;\n`);
    expect(errors.length).toBeGreaterThanOrEqual(1);
    for (const e of errors) expect(e).toMatch(/layer rule/);
  });

  it.each([
    ['stats → stats', 'src/lib/stats/models/probe.ts', "import { mean } from '../moments';"],
    ['domain → stats', 'src/lib/domain/probe.ts', "import { mean } from '../stats/moments';"],
    [
      'UI → storage repositories',
      'src/lib/ui/probe.ts',
      "import type { CapstanStorage } from '../storage/storage';"
    ],
    [
      'worker → the portfolio reader',
      'src/lib/workers/probe.worker.ts',
      "import { readPortfolio } from '../storage/portfolio-reader';"
    ],
    [
      'exchange worker → the storage object (it merges a received file)',
      'src/lib/workers/exchange-file.worker.ts',
      "import { openStorage } from '../storage/storage';"
    ],
    [
      'command line → exchange',
      'src/cli/probe.ts',
      "import { decodeExchangeFile } from '../lib/exchange/exchange-file';"
    ]
  ])('allows %s', async (_name, filePath, code) => {
    expect(await layerErrors(filePath, `${code}\nexport const probe = 1;\n`)).toEqual([]);
  });
});

describe('a Dexie transaction scope is an async function', () => {
  const errorsOf = async (code: string) => {
    const [result] = await eslint.lintText(code, { filePath: 'src/lib/storage/probe.ts' });
    return (result?.messages ?? []).filter((m) => m.ruleId === 'no-restricted-syntax');
  };
  it('refuses a plain arrow or function as the scope', async () => {
    expect(
      await errorsOf('export const p = (db: any) => db.transaction("r", db.t, () => db.t.get(1));\n')
    ).toHaveLength(1);
    expect(
      await errorsOf('export const p = (db: any) => db.transaction("r", db.t, function () { return 1; });\n')
    ).toHaveLength(1);
  });
  it('allows an async scope', async () => {
    expect(
      await errorsOf(
        'export const p = (db: any) => db.transaction("r", db.t, async (tx: any) => tx.t.get(1));\n'
      )
    ).toEqual([]);
  });
});
