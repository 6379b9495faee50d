import { expect, test } from '@playwright/test';
import { startStaticServer, waitForServiceWorker } from './static-server';

test('after one visit the app loads and works with the server gone and the network off', async ({
  page,
  context
}) => {
  const server = await startStaticServer();
  await page.goto(server.url);
  // The worker precaches the whole app on its first install; wait until it controls the page.
  await waitForServiceWorker(page);
  await page.getByTestId('load-demo').click();
  const rows = page.getByTestId('portfolio-table').locator('tbody tr');
  await expect(rows).not.toHaveCount(0);
  // A new list is drawn a few rows per task, busy until the last.
  await expect(page.getByTestId('portfolio-table')).toHaveAttribute('aria-busy', 'false');
  const count = await rows.count();
  const firstProcess = page.getByTestId('portfolio-table').locator('tbody tr th a').first();
  const processHref = (await firstProcess.getAttribute('href')) as string;
  const processName = (await firstProcess.textContent())?.trim() as string;

  await server.stop();
  await context.setOffline(true);

  await page.reload();
  await expect(page.getByTestId('connection')).toContainText('Offline');
  await expect(page.getByTestId('portfolio-table').locator('tbody tr')).toHaveCount(count);

  // A deep link that no file on the server matches is answered by the cached app shell.
  await page.goto(new URL(processHref, server.url).href);
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(processName);
  await page.goto(new URL('/settings', server.url).href);
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Settings');
});
