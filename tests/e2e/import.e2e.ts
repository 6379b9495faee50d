import { expect, test, type Page } from '@playwright/test';
import { addMonths } from '../../src/lib/domain/period';
import { QUIET_MONTH } from './demo-dates';
import { startStaticServer, type RunningServer } from './static-server';

const MONTH = QUIET_MONTH;
const [YEAR, MM] = MONTH.split('-') as [string, string];
let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => {
  await server.stop();
});

async function setUp(page: Page) {
  await page.goto(server.url);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
}

async function recordCounts(page: Page): Promise<string> {
  await page.getByRole('link', { name: 'File exchange' }).click();
  return (await page.getByTestId('record-counts').textContent()) ?? '';
}

async function openLog(page: Page) {
  await page.getByRole('link', { name: 'Monthly log' }).click();
  await page.getByTestId('log-site').selectOption({ label: 'Harbour Foods Filling' });
  await page.getByLabel('Reporting month').fill(MONTH);
  await expect(page.getByTestId('open-count')).toContainText(`for ${MONTH}`);
}

function csv(name: string, text: string) {
  return { name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') };
}

test('imports a CSV with semicolons and decimal commas, mapped by column, after a summary', async ({
  page
}) => {
  await setUp(page);
  await openLog(page);
  const rows = [
    'Merkmal;Datum;Wert',
    ...Array.from(
      { length: 30 },
      (_, i) => `Cap removal torque;${String((i % 28) + 1).padStart(2, '0')}.${MM}.${YEAR};1,${70 + (i % 9)}`
    ),
    ...Array.from(
      { length: 25 },
      (_, i) =>
        `Oat bar baking — oven 1 / Moisture content;${MONTH}-${String((i % 20) + 1).padStart(2, '0')};10,${10 + i}`
    )
  ];
  await page.getByTestId('import-file').setInputFiles(csv('februar.csv', rows.join('\r\n')));
  await expect(page.getByTestId('import-delimiter')).toHaveValue(';');
  await expect(page.getByTestId('import-decimal')).toHaveValue(',');
  await expect(page.getByTestId('import-preview')).toContainText('Cap removal torque');
  await expect(page.getByTestId('map-characteristic').locator('option:checked')).toHaveText('Merkmal');
  await expect(page.getByTestId('map-period').locator('option:checked')).toHaveText('Datum');
  await page.getByTestId('import-read').click();
  await expect(page.getByTestId('import-summary')).toHaveText('55 values in 2 studies.');
  // Back to the columns keeps the file: the mapping can be mended without picking it again.
  await page.getByTestId('import-back').click();
  await expect(page.getByText('februar.csv')).toBeVisible();
  await expect(page.getByTestId('map-value').locator('option:checked')).toHaveText('Wert');
  await page.getByTestId('import-read').click();
  await expect(page.getByTestId('import-summary')).toHaveText('55 values in 2 studies.');
  await page.getByTestId('import-commit').click();
  await expect(page.getByTestId('import-message')).toContainText('Imported 55 values: 2 studies created');
  const row = (name: string) => page.locator('tbody tr').filter({ hasText: name });
  await expect(row('Cap removal torque')).toContainText('30');
  await expect(row('Moisture content').filter({ hasText: 'oven 1' })).toContainText('25');
});

test('rows that cannot be read are listed by line, and "import nothing" leaves the database as it was', async ({
  page
}) => {
  await setUp(page);
  const before = await recordCounts(page);
  await openLog(page);
  const text = [
    'characteristic,value',
    'Cap removal torque,1.75',
    'Cap removal torque,abc',
    'Lid colour,2.0',
    'Cap removal torque,',
    'Cap removal torque,1.81'
  ].join('\n');
  await page.getByTestId('import-file').setInputFiles(csv('bad.csv', text));
  await page.getByTestId('import-read').click();
  const bad = page.getByTestId('import-bad-rows');
  await expect(bad).toContainText("line 3: column 2: 'abc' is not a number");
  await expect(bad).toContainText("line 4: column 1: no characteristic named 'Lid colour' at this site");
  await expect(bad).toContainText('line 5: column 2: the value is empty');
  await expect(page.getByTestId('import-commit')).toHaveText('Import the 2 good rows');
  await page.getByTestId('import-nothing').click();
  await expect(page.getByTestId('import-message')).toHaveText('Nothing was imported.');
  expect(await recordCounts(page)).toBe(before);
});

test('a million-row file is read in the background: the page answers clicks, and cancelling writes nothing', async ({
  page
}) => {
  test.setTimeout(120_000);
  await setUp(page);
  const before = await recordCounts(page);
  await openLog(page);
  const lines = ['thickness'];
  for (let i = 0; i < 1_000_000; i += 1) lines.push((100 + ((i * 7919) % 1000) / 100).toFixed(2));
  await page.getByTestId('import-file').setInputFiles(csv('million.csv', lines.join('\n')));
  await page.getByTestId('import-month').fill(MONTH);
  await page.getByTestId('import-read').click();
  await expect(page.getByTestId('import-progress')).toBeVisible();
  // While the worker reads, the page still handles input.
  await page.getByRole('button', { name: '‹ Earlier month' }).click();
  await expect(page.getByLabel('Reporting month')).toHaveValue(addMonths(MONTH, -1));
  await expect(page.getByTestId('import-progress')).toBeVisible();
  await page.getByTestId('import-cancel').click();
  await expect(page.getByTestId('import-message')).toHaveText('Reading cancelled. Nothing was imported.');
  expect(await recordCounts(page)).toBe(before);
});
