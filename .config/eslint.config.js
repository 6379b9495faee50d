import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from '../svelte.config.js';

/**
 * Layer rules: dependencies point inwards (ui → domain/storage/exchange → stats). Each layer lists what it
 * must not import; a violation is an error, not a warning.
 */
const layer = (files, forbidden, why) => ({
  files,
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: forbidden.map((group) => ({
          group: [group],
          message: `${why} (layer rule, see DEVELOPERS.md)`
        }))
      }
    ]
  }
});

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
    ['$lib/*', '../domain/*', '../storage/*', '../exchange/*', '../ui/*', 'dexie', ...FRAMEWORKS],
    'stats is pure numeric code: no domain, storage, UI, Svelte, Dexie or ECharts'
  ),
  layer(
    ['src/lib/domain/**'],
    ['$lib/*', '../storage/*', '../exchange/*', '../ui/*', 'dexie', ...FRAMEWORKS],
    'domain is pure: it may use stats, never storage, exchange or UI'
  ),
  layer(
    ['src/lib/storage/**'],
    ['$lib/*', '../ui/*', '../exchange/*', ...FRAMEWORKS],
    'storage may use domain and stats, never UI or exchange'
  ),
  layer(
    ['src/lib/exchange/**'],
    ['$lib/*', '../ui/*', 'dexie', ...FRAMEWORKS],
    'exchange may use domain, storage types and stats, never UI or Dexie directly'
  ),
  layer(
    ['src/lib/ui/**'],
    ['dexie', '../storage/database', '../storage/schema-versions'],
    'UI reaches data only through the storage repositories'
  ),
  layer(
    ['src/routes/**'],
    ['dexie', '$lib/storage/database', '$lib/storage/schema-versions'],
    'pages reach data only through the storage repositories'
  ),
  layer(
    ['src/cli/**'],
    ['$lib/*', '../lib/ui/*', 'dexie', ...FRAMEWORKS],
    'the command line runs in Node on stats, domain and exchange'
  )
);
