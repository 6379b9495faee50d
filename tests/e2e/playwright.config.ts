import { defineConfig } from '@playwright/test';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../support/chromium.mjs';

/**
 * End-to-end tests on the built app (`build/`), in Debian's Chromium: Playwright's own browser download
 * cannot run on these machines. Each test gets a fresh browser context, so a fresh IndexedDB.
 */

export default defineConfig({
  testDir: '.',
  testMatch: '**/*.e2e.ts',
  outputDir: './.output',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list'], ['json', { outputFile: './.output/results.json' }]],
  use: {
    browserName: 'chromium',
    launchOptions: { executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS },
    trace: 'off',
    screenshot: 'only-on-failure'
  }
});
