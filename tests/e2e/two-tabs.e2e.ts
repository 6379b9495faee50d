import { expect, test } from '@playwright/test';
import { startStaticServer, type RunningServer } from './static-server';

/**
 * Two tabs of the app on one device share one database: what one writes appears in the other without a
 * reload, and two edits of the same record from stale forms do not lose either — the second is refused with a
 * message instead of silently replacing the first.
 */
let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => server.stop());

test('a site added in one tab appears in the other, and a crossing edit is refused, not lost', async ({
  context
}) => {
  const a = await context.newPage();
  const b = await context.newPage();
  await a.goto(new URL('/setup', server.url).href);
  await b.goto(new URL('/setup', server.url).href);
  await expect(b.getByText('No sites yet.')).toBeVisible();

  await a.getByLabel('Site name').fill('Quayside Works');
  await a.getByLabel('Time zone').fill('Europe/Lisbon');
  await a.getByRole('button', { name: 'Add site' }).click();
  // Tab B was not reloaded.
  await expect(b.getByTestId('site-list')).toContainText('Quayside Works');

  // Both open the same site for editing; A saves first.
  await a.getByRole('button', { name: 'Edit Quayside Works' }).click();
  await b.getByRole('button', { name: 'Edit Quayside Works' }).click();
  await a.getByLabel('Site name').fill('Quayside Works (north yard)');
  await a.getByRole('button', { name: 'Save site' }).click();
  await expect(b.getByTestId('site-list')).toContainText('Quayside Works (north yard)');
  await b.getByLabel('Site name').fill('Quayside Works (south yard)');
  await b.getByRole('button', { name: 'Save site' }).click();
  await expect(b.getByRole('alert')).toContainText(
    'was changed elsewhere (another tab or an imported file) after you opened it'
  );
  await expect(a.getByTestId('site-list')).toContainText('Quayside Works (north yard)');
  await expect(b.getByTestId('site-list')).not.toContainText('south yard');

  // Opening it again and redoing the edit works.
  await b.getByRole('button', { name: 'Edit Quayside Works (north yard)' }).click();
  await b.getByLabel('Site name').fill('Quayside Works (both yards)');
  await b.getByRole('button', { name: 'Save site' }).click();
  await expect(a.getByTestId('site-list')).toContainText('Quayside Works (both yards)');
});
