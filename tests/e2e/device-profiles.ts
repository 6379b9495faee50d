import { chromium, expect, type BrowserContext, type Page } from '@playwright/test';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../support/chromium.mjs';
import { waitForServiceWorker } from './static-server';

/**
 * Devices for the multi-device browser tests: each a Chromium profile of its own (its own user-data directory,
 * so its own IndexedDB and origin-private file system), named in Settings as a person would name it.
 */
export function deviceProfiles() {
  const open: { context: BrowserContext; dir: string }[] = [];
  return {
    async device(
      url: string,
      label: string,
      name: string,
      prepare?: (context: BrowserContext) => Promise<unknown>
    ): Promise<{ page: Page; context: BrowserContext }> {
      const dir = mkdtempSync(join(tmpdir(), `capstan-profile-${label}-`));
      const context = await chromium.launchPersistentContext(dir, {
        executablePath: CHROMIUM_PATH,
        args: CHROMIUM_ARGS,
        acceptDownloads: true,
        locale: 'en-GB'
      });
      open.push({ context, dir });
      await prepare?.(context);
      const page = context.pages()[0] ?? (await context.newPage());
      await page.goto(url);
      await waitForServiceWorker(page);
      await nav(page, 'Settings').click();
      await page.getByLabel('Your name, recorded on every study entered here').fill(name);
      await page.getByRole('button', { name: 'Save name' }).click();
      await expect(page.getByText('Saved.').first()).toBeVisible();
      return { page, context };
    },
    async closeAll(): Promise<void> {
      for (const p of open.splice(0)) {
        await p.context.close();
        rmSync(p.dir, { recursive: true, force: true });
      }
    }
  };
}

export function nav(page: Page, name: string) {
  return page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name });
}

/** Sets the key-characteristic level of the built-in "Vehicle parts" targets in Settings. */
export async function editVehicleKeyTarget(page: Page, value: string) {
  await nav(page, 'Settings').click();
  await page.getByRole('button', { name: 'Edit targets of Vehicle parts' }).click();
  await page.getByTestId('profile-form').locator('input[name="level-key"]').fill(value);
  await page.getByRole('button', { name: 'Save targets' }).click();
  await expect(page.getByText('Saved the targets of Vehicle parts')).toBeVisible();
}
