import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from '../svelte.config.js';

/**
 * Layer rules: dependencies point inwards (ui → exchange → storage → domain → stats; workers use domain and
 * stats, and reach storage only through storage/portfolio-reader (records read, read model kept) — the exchange
 * worker also through the storage object, to merge a received file; the command line uses stats, domain and exchange).
 * Each layer lists what it must not import, as
 * gitignore-style patterns that match at any folder depth and through the `$lib` alias (the storage
 * pattern catches `../../storage/x` and `$lib/storage/x` alike). A violation is an error. tests/unit/layer-rules.spec.ts
 * lints a probe file for every rule, so that no rule can silently open again.
 */
const layer = (files, forbidden, why, names = []) => ({
  files,
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: [
          ...forbidden.map((group) => ({
            // A list is one gitignore-style group, so that a `!` line can let one module through.
            group: Array.isArray(group) ? group : [group],
            message: `${why} (layer rule, see DEVELOPERS.md)`
          })),
          ...names.map(({ group, importNames }) => ({
            group: [group],
            importNames,
            message: `${why} (layer rule, see DEVELOPERS.md)`
          }))
        ]
      }
    ]
  }
});

/** Every folder of a layer, however it is reached. */
const any = (folder) => [`**/${folder}`, `**/${folder}/**`, `$lib/${folder}`, `$lib/${folder}/**`];
const DATABASE = ['**/storage/database', '**/storage/schema-versions', '**/storage/local-sequence'];

/**
 * What a worker must not import: storage but the modules named (files under storage, not the folder itself:
 * gitignore cannot re-include a file of an excluded folder), UI, the command line, Dexie and the frameworks.
 */
const workerForbidden = (storageModules) => [
  ['**/storage/*', '**/storage/**/*', '$lib/storage/*', ...storageModules.map((m) => `!**/storage/${m}`)],
  ...any('ui'),
  ...any('cli'),
  '$lib/**',
  'dexie',
  ...FRAMEWORKS
];

/** The browser-side frameworks: only UI code and pages may import them. */
const FRAMEWORKS = ['svelte', 'svelte/*', 'echarts', 'echarts/*', '$app/*'];

export default ts.config(
  {
    ignores: [
      'build/',
      '.svelte-kit/',
      'node_modules/',
      'static/icons/',
      'tests/e2e/.output/',
      'test-results/'
    ]
  },
  js.configs.recommended,
  ...ts.configs.recommended,
  ...svelte.configs.recommended,
  prettier,
  ...svelte.configs.prettier,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node, __APP_VERSION__: 'readonly' } },
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-duplicate-imports': 'error',
      // Links are plain root-relative hrefs: the app is always served at '/'.
      'svelte/no-navigation-without-resolve': 'off'
    }
  },
  {
    // Dexie keeps a transaction's zone across native awaits only when its scope function is async: a plain arrow
    // returning an async helper's promise lost it in Chromium once the helper had awaited a few reads, and the
    // reads after ran outside the transaction (a received file already held here was refused: "Transaction
    // committed too early"). fake-indexeddb does not show it, so the rule is held here.
    files: ['src/**/*.ts', 'tests/**/*.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector:
            "CallExpression[callee.property.name='transaction'] > :matches(ArrowFunctionExpression, FunctionExpression)[async=false]",
          message:
            'A Dexie transaction scope must be an async function: a plain one loses the transaction across native awaits (see .config/eslint.config.js)'
        }
      ]
    }
  },
  {
    files: ['**/*.svelte', '**/*.svelte.ts'],
    languageOptions: {
      parserOptions: {
        projectService: false,
        extraFileExtensions: ['.svelte'],
        parser: ts.parser,
        svelteConfig
      }
    }
  },
  layer(
    ['src/lib/stats/**'],
    [
      ...any('domain'),
      ...any('storage'),
      ...any('exchange'),
      ...any('ui'),
      ...any('workers'),
      ...any('cli'),
      '$lib/**',
      'dexie',
      ...FRAMEWORKS
    ],
    'stats is pure numeric code: no domain, storage, exchange, UI, workers, Svelte, Dexie or ECharts'
  ),
  layer(
    ['src/lib/domain/**'],
    [
      ...any('storage'),
      ...any('exchange'),
      ...any('ui'),
      ...any('workers'),
      ...any('cli'),
      '$lib/**',
      'dexie',
      ...FRAMEWORKS
    ],
    'domain is pure: it may use stats, never storage, exchange, UI or workers'
  ),
  layer(
    ['src/lib/storage/**'],
    [
      ...any('exchange'),
      ...any('spreadsheet'),
      ...any('ui'),
      ...any('workers'),
      ...any('cli'),
      '$lib/**',
      ...FRAMEWORKS
    ],
    'storage may use domain and stats, never exchange, spreadsheets, UI or workers'
  ),
  layer(
    ['src/lib/exchange/**'],
    [...any('ui'), ...any('workers'), ...any('cli'), ...DATABASE, '$lib/**', 'dexie', ...FRAMEWORKS],
    'exchange may use domain, storage repositories and types, and stats — never the database, UI or workers'
  ),
  layer(
    ['src/lib/spreadsheet/**'],
    [
      ...any('storage'),
      ...any('exchange'),
      ...any('ui'),
      ...any('workers'),
      ...any('cli'),
      '$lib/**',
      'dexie',
      ...FRAMEWORKS
    ],
    'spreadsheet files (CSV in and out) use domain and stats only; the page commits what they read'
  ),
  layer(
    ['src/lib/workers/**'],
    workerForbidden(['portfolio-reader']),
    'workers compute on stats, domain and exchange, and reach IndexedDB only through storage/portfolio-reader, which reads records and keeps the device-local read model derived from them; they never write a record (the page commits)'
  ),
  layer(
    ['src/lib/workers/exchange-file.worker.ts'],
    workerForbidden(['portfolio-reader', 'storage']),
    'the exchange worker writes records only as a received file is merged, through the storage object (storage.exchange, one transaction, on the person’s confirmation), and reads them through it to write a file to send; other workers reach IndexedDB only through storage/portfolio-reader'
  ),
  layer(
    ['src/lib/ui/**', 'src/routes/**'],
    [...DATABASE, ...any('cli'), 'dexie'],
    'UI and pages reach data only through the storage repositories, never the database',
    [{ group: '**/storage/storage', importNames: ['databaseOf'] }]
  ),
  layer(
    ['src/cli/**'],
    [...any('ui'), ...any('storage'), ...any('workers'), '$lib/**', 'dexie', ...FRAMEWORKS],
    'the command line runs in Node on stats, domain and exchange (there is no browser database)'
  )
);
