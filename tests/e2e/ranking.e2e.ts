import { expect, test } from '@playwright/test';
import { startStaticServer, type RunningServer } from './static-server';
import { drawEveryChart, drawnChart } from './charts-in-view';

let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => {
  await server.stop();
});

test('the ranked portfolio follows a context target change, and a click leads to the process charts', async ({
  page
}) => {
  await page.goto(server.url);
  await page.getByTestId('load-demo').click();
  const table = page.getByTestId('portfolio-table');
  await expect(table.locator('tbody tr')).toHaveCount(32);
  await page.getByTestId('portfolio-order').selectOption('gap');
  const firstSite = () => table.locator('tbody tr').first().locator('th .small').textContent();

  // The table as a spreadsheet file, offline-capable (no server involved in the download).
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByTestId('portfolio-csv').click()
  ]);
  expect(download.suggestedFilename()).toMatch(/^capstan-portfolio-\d{4}-\d{2}-3m\.csv$/);
  const csvText = await (await download.createReadStream()).toArray();
  const csv = Buffer.concat(csvText).toString('utf8');
  expect(csv.split('\r\n')[0]).toMatch(/^rank,process,site,context,status/);
  expect(csv.trim().split('\r\n')).toHaveLength(33);
  expect(await firstSite()).not.toContain('Eastgate Service Centre');

  // Filters narrow the list and its CSV alike (one rule over the list's columns, page and worker).
  await page.getByLabel('Site').selectOption({ label: 'Eastgate Service Centre' });
  const siteRows = table.locator('tbody tr');
  // The narrowed list is drawn a few rows per task, busy until the last.
  await expect(table).toHaveAttribute('aria-busy', 'false');
  const shown = await siteRows.count();
  expect(shown).toBeGreaterThan(0);
  expect(shown).toBeLessThan(32);
  for (const site of await siteRows.locator('th .small').allTextContents())
    expect(site).toContain('Eastgate Service Centre');
  const [filtered] = await Promise.all([
    page.waitForEvent('download'),
    page.getByTestId('portfolio-csv').click()
  ]);
  const filteredCsv = Buffer.concat(await (await filtered.createReadStream()).toArray()).toString('utf8');
  expect(filteredCsv.trim().split('\r\n')).toHaveLength(shown + 1);
  await page.getByLabel('Site').selectOption({ label: 'all' });
  await expect(siteRows).toHaveCount(32);

  // A much stricter target for service work puts a service process at the top of the gap order.
  await page.getByRole('link', { name: 'Settings' }).click();
  await page.getByRole('button', { name: 'Edit targets of Transactional and service work' }).click();
  const form = page.getByTestId('profile-form');
  await form.locator('input[name="level-standard"]').fill('7');
  await form.locator('input[name="level-key"]').fill('7');
  // The safety target (4.5) now asks less than the standard one: a reason is asked for, the levels named.
  await expect(page.getByTestId('safety-lowered')).toContainText('standard characteristics (7)');
  await page.getByRole('button', { name: 'Save targets' }).click();
  await expect(form.locator('.error')).toContainText('say why');
  await form.locator('input[name="level-safety"]').fill('7');
  await expect(page.getByTestId('safety-lowered')).toHaveCount(0);
  await page.getByRole('button', { name: 'Save targets' }).click();
  await expect(page.getByText('Saved the targets of Transactional and service work')).toBeVisible();
  await page.getByRole('link', { name: 'Portfolio', exact: true }).click();
  await page.getByTestId('portfolio-order').selectOption('gap');
  await expect(table.locator('tbody tr').first().locator('th .small')).toContainText(
    'Eastgate Service Centre'
  );

  // Badges explain themselves in one sentence.
  const badge = table.getByRole('button', { name: 'shift convention' }).first();
  await badge.click();
  await expect(page.getByRole('note').first()).toContainText('1.5 is added to every long-term z-level');

  // A project from a short row.
  const shortRow = table.locator('tbody tr').filter({ hasText: 'none, short' }).first();
  const name = (await shortRow.locator('th a').textContent())?.trim() as string;
  await shortRow.getByRole('button', { name: `Details of ${name}` }).click();
  await page.getByTestId('create-project').click();
  await page.getByTestId('confirm-start-project').click();
  await expect(page.getByText(`(Define phase) on ${name}`)).toBeVisible();
  await expect(table.locator('tbody tr').filter({ hasText: name }).first()).toContainText('Define');

  // The process page draws its charts.
  await page.getByTestId('row-detail').getByRole('link', { name }).click();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(name);
  await drawnChart(page.getByTestId('chart').first());
  expect(await page.getByTestId('chart').count()).toBeGreaterThanOrEqual(1);
});

test('a measured process page shows history, histogram, probability plot and control chart', async ({
  page
}) => {
  await page.goto(server.url);
  await page.getByTestId('load-demo').click();
  await page.getByRole('link', { name: 'Camshaft journal grinding — line A', exact: true }).click();
  await expect(page.getByText('Journal diameter: z-level by month, required')).toBeVisible();
  await expect(page.getByText(/Journal diameter, \d{4}-\d{2}: values with the limits/)).toBeVisible();
  await expect(
    page.getByText(/Journal diameter, \d{4}-\d{2}: probability plot against the \w+ model the figures use/)
  ).toBeVisible();
  // How well the model fits: the normality test, and the models compared when it rejects normality.
  const models = page.getByRole('region', { name: /Models compared for Journal diameter/ });
  await expect(models).toContainText(/Anderson–Darling A² [\d.]+, p [<\d.]/);
  await expect(page.getByText(/Journal diameter, \d{4}-\d{2}: control chart/)).toBeVisible();
  // The control chart draws both panels: the location and the spread, each with its limits.
  const control = page.getByTestId('chart').nth(3);
  await drawnChart(control);
  await expect(control.locator('svg text', { hasText: 'UCL' })).toHaveCount(2);
  await drawEveryChart(page);
  await page.screenshot({ path: 'tests/e2e/.output/pages/1280-process-charts.png', fullPage: true });
});
