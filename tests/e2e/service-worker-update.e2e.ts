import { QUIET_MONTH } from './demo-dates';
import { expect, test } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { cpSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { startStaticServer, waitForServiceWorker, type RunningServer } from './static-server';

/**
 * Deploying a new version while someone is typing: the server first serves the current build (version 1),
 * the user loads data and types half an entry; then the same address serves a build of version 2. The update
 * prompt appears, nothing reloads by itself, the draft survives, and after accepting the page runs version 2
 * with all data and the draft intact.
 */
const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const work = mkdtempSync(join(tmpdir(), 'capstan-sw-update-'));
const site = join(work, 'site');
const next = join(work, 'next');
const NEXT_VERSION = '99.0.0-next';
let server: RunningServer | undefined;

test.beforeAll(() => {
  // Version 2: the same sources built with another version number into a separate folder.
  execFileSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'error'], {
    cwd: ROOT,
    env: { ...process.env, CAPSTAN_VERSION: NEXT_VERSION, CAPSTAN_BUILD_DIR: next },
    stdio: 'ignore'
  });
  cpSync(join(ROOT, 'build'), site, { recursive: true });
});
test.afterAll(async () => {
  await server?.stop();
  rmSync(work, { recursive: true, force: true });
});

test('a new version is offered, not forced; the unsaved entry and the data survive the update', async ({
  page
}) => {
  test.setTimeout(120_000);
  server = await startStaticServer(site);
  const nav = (name: string) => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name });
  await page.goto(server.url);
  await waitForServiceWorker(page);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  // A returning user: the page is opened again, now under the installed worker.
  await page.reload();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  await nav('Settings').click();
  await expect(page.getByText(/Capstan \d+\.\d+\.\d+/)).not.toContainText(NEXT_VERSION);

  await nav('Monthly log').click();
  await page.getByTestId('log-site').selectOption({ label: 'Harbour Foods Filling' });
  await page.getByLabel('Reporting month').fill(QUIET_MONTH);
  await page.getByRole('button', { name: 'Log Cap removal torque (Sauce jar capping — capper 2)' }).click();
  const panel = page.getByTestId('entry-panel');
  await panel.getByRole('textbox', { name: 'n', exact: true }).fill('36');
  await panel.getByRole('textbox', { name: 'Mean', exact: true }).fill('1.77');
  await expect(page.getByTestId('draft-status')).toContainText('Draft kept on this device');

  // Deploy version 2 at the same address, and let the browser look for it.
  rmSync(site, { recursive: true, force: true });
  cpSync(next, site, { recursive: true });
  await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.update());
  await expect(page.getByTestId('update-prompt')).toBeVisible({ timeout: 30_000 });
  // Nothing reloaded: the half-typed entry is still on screen.
  await expect(panel.getByRole('textbox', { name: 'Mean', exact: true })).toHaveValue('1.77');

  await Promise.all([page.waitForEvent('load'), page.getByRole('button', { name: 'Reload now' }).click()]);
  await nav('Settings').click();
  await expect(page.getByText(`Capstan ${NEXT_VERSION}`)).toBeVisible();
  await nav('Portfolio').click();
  await expect(page.getByTestId('portfolio-table').locator('tbody tr')).toHaveCount(32);
  await nav('Monthly log').click();
  await page.getByTestId('log-site').selectOption({ label: 'Harbour Foods Filling' });
  await page.getByLabel('Reporting month').fill(QUIET_MONTH);
  await page.getByRole('button', { name: 'Log Cap removal torque (Sauce jar capping — capper 2)' }).click();
  await expect(page.getByText('Restored the entry you had not saved')).toBeVisible();
  await expect(panel.getByRole('textbox', { name: 'Mean', exact: true })).toHaveValue('1.77');
});
