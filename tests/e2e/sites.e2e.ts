import { expect, test } from '@playwright/test';
import { startStaticServer, type RunningServer } from './static-server';

let server: RunningServer;
test.beforeAll(async () => {
  server = await startStaticServer();
});
test.afterAll(async () => {
  await server.stop();
});

test('a site added in settings is still there after a reload', async ({ page }) => {
  await page.goto(new URL('/setup', server.url).href);
  await page.getByLabel('Site name').fill('Fjordside Plant');
  await page.getByLabel('Region').fill('Nordics');
  await page.getByLabel('Time zone').fill('Europe/Oslo');
  await page.getByRole('button', { name: 'Add site' }).click();
  await expect(page.getByTestId('site-list')).toContainText('Fjordside Plant');
  await page.reload();
  await expect(page.getByTestId('site-list')).toContainText('Fjordside Plant');
  await expect(page.getByTestId('site-list')).toContainText('Europe/Oslo');
});

test('bad site input is explained beside its field and stores nothing', async ({ page }) => {
  await page.goto(new URL('/setup', server.url).href);
  await page.getByLabel('Site name').fill('   ');
  await page.getByLabel('Time zone').fill('Atlantis/Lost');
  await page.getByRole('button', { name: 'Add site' }).click();
  await expect(page.getByText('Site name is required')).toBeVisible();
  await expect(page.getByText("'Atlantis/Lost' is not a known time zone")).toBeVisible();
  await page.reload();
  await expect(page.getByText('No sites yet.')).toBeVisible();
});

test('deleting a site can be undone', async ({ page }) => {
  await page.goto(new URL('/setup', server.url).href);
  await page.getByLabel('Site name').fill('Short-lived Site');
  await page.getByRole('button', { name: 'Add site' }).click();
  await page.getByRole('button', { name: 'Delete Short-lived Site' }).click();
  await expect(page.getByText('No sites yet.')).toBeVisible();
  await page.getByRole('button', { name: 'Undo' }).click();
  await expect(page.getByTestId('site-list')).toContainText('Short-lived Site');
});
