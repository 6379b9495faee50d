import { defineConfig } from '@playwright/test';

/**
 * End-to-end tests on the built app (`build/`), in Debian's Chromium: Playwright's own browser download
 * cannot run on these machines. Each test gets a fresh browser context, so a fresh IndexedDB.
 */
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync'
];

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
    launchOptions: { executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: CHROMIUM_ARGS },
    trace: 'off',
    screenshot: 'only-on-failure'
  }
});
