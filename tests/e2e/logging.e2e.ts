import { expect, test, type Page } from '@playwright/test';
import { QUIET_MONTH } from './demo-dates';
import { startStaticServer, waitForServiceWorker, type RunningServer } from './static-server';

// A month with no demo data, so every characteristic starts "not yet logged" whatever today's date is.
const MONTH = QUIET_MONTH;
// A German locale: decimal comma and point as thousands separator, as many sites type.
test.use({ locale: 'de-DE' });

let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => {
  await server.stop();
});

async function openLog(page: Page, site: string) {
  await page.getByRole('link', { name: 'Monthly log' }).click();
  await page.getByTestId('log-site').selectOption({ label: site });
  await page.getByLabel('Reporting month').fill(MONTH);
  await expect(page.getByTestId('open-count')).toContainText(`for ${MONTH}`);
}

async function loadDemo(page: Page) {
  await page.goto(server.url);
  await waitForServiceWorker(page);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
}

function row(page: Page, characteristic: string) {
  return page.locator('tbody tr').filter({ hasText: characteristic });
}

test('logs a summary, a count and a pasted block of values with the network off', async ({
  page,
  context
}) => {
  await loadDemo(page);
  await server.stop();
  await context.setOffline(true);
  await openLog(page, 'North Ridge Machining');

  // Summary with decimal commas; the figures appear before saving; Ctrl+Enter saves.
  await page
    .getByRole('button', { name: 'Log Leak rate (Gearbox housing leak test — test bench 1)' })
    .click();
  const panel = page.getByTestId('entry-panel');
  await panel.getByRole('textbox', { name: 'n', exact: true }).fill('80');
  await panel.getByRole('textbox', { name: 'Mean', exact: true }).fill('2,31');
  await panel.getByRole('textbox', { name: 'Standard deviation', exact: true }).fill('0,45');
  await expect(page.getByTestId('entry-preview')).toContainText('z-level');
  await expect(page.getByTestId('entry-preview')).toContainText('Ppk');
  await panel.getByRole('textbox', { name: 'Standard deviation', exact: true }).press('Control+Enter');
  await expect(page.getByTestId('saved-notice')).toContainText(`Saved Leak rate for ${MONTH} (created)`);
  await expect(row(page, 'Leak rate').filter({ hasText: 'test bench 1' }).first()).toContainText('logged');

  // A count, with a thousands separator.
  await page
    .getByRole('button', { name: 'Log Torque outside window (Wheel-hub bolt torque audit — assembly 1)' })
    .click();
  await panel.getByRole('textbox', { name: 'Units inspected', exact: true }).fill('1.800');
  await panel.getByRole('textbox', { name: 'Defective units', exact: true }).fill('3');
  await expect(page.getByTestId('entry-preview')).toContainText('99,83');
  await panel.getByRole('button', { name: 'Save study' }).click();
  // Each save is awaited by its own notice: the previous one is still on screen.
  await expect(page.getByTestId('saved-notice')).toContainText(
    `Saved Torque outside window for ${MONTH} (created)`
  );

  // Cells pasted from a spreadsheet: header row, subgroup column, decimal commas.
  await page
    .getByRole('button', { name: 'Log Journal diameter (Camshaft journal grinding — line A)' })
    .click();
  await panel.getByRole('radio', { name: 'Individual measured values' }).check();
  const block = [
    'Stichprobe\tDurchmesser',
    ...Array.from({ length: 20 }, (_, i) => `${Math.floor(i / 5) + 1}\t24,99${i % 10}`)
  ].join('\n');
  await panel.getByRole('textbox', { name: /Values/ }).fill(block);
  await expect(page.getByTestId('raw-summary')).toContainText(
    "20 values in 4 subgroups; header 'Stichprobe, Durchmesser' skipped"
  );
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(page.getByTestId('saved-notice')).toContainText(
    `Saved Journal diameter for ${MONTH} (created)`
  );

  // Still there after a reload with no network.
  await page.reload();
  await page.getByTestId('log-site').selectOption({ label: 'North Ridge Machining' });
  await page.getByLabel('Reporting month').fill(MONTH);
  await expect(page.getByTestId('open-count')).toContainText(`for ${MONTH}`);
  for (const name of ['Leak rate', 'Torque outside window', 'Journal diameter']) {
    await expect(
      row(page, name).filter({ hasText: 'logged' }).filter({ hasNotText: 'not yet' }).first()
    ).toBeVisible();
  }
});

test('an entry typed halfway survives the tab closing', async ({ page, context }) => {
  await loadDemo(page);
  await openLog(page, 'Harbour Foods Filling');
  await page.getByRole('button', { name: 'Log Cap removal torque (Sauce jar capping — capper 2)' }).click();
  const panel = page.getByTestId('entry-panel');
  await panel.getByRole('textbox', { name: 'n', exact: true }).fill('36');
  await panel.getByRole('textbox', { name: 'Mean', exact: true }).fill('1,77');
  await expect(page.getByTestId('draft-status')).toContainText('Draft kept on this device');
  await page.close();

  const again = await context.newPage();
  await again.goto(server.url);
  await openLog(again, 'Harbour Foods Filling');
  await expect(row(again, 'Cap removal torque')).toContainText('unsaved entry');
  await again.getByRole('button', { name: 'Log Cap removal torque (Sauce jar capping — capper 2)' }).click();
  await expect(again.getByText('Restored the entry you had not saved')).toBeVisible();
  await expect(again.getByTestId('entry-panel').getByRole('textbox', { name: 'n', exact: true })).toHaveValue(
    '36'
  );
  await expect(
    again.getByTestId('entry-panel').getByRole('textbox', { name: 'Mean', exact: true })
  ).toHaveValue('1,77');
});

test('an open entry panel turns to correcting when that month is saved in another tab', async ({
  page,
  context
}) => {
  await loadDemo(page);
  await openLog(page, 'Harbour Foods Filling');
  const name = /^(Log|Change) Bars broken at packing \(Oat bar baking — oven 1\)/;
  const panel = page.getByTestId('entry-panel');
  await page.getByRole('button', { name }).click();
  await expect(panel.getByRole('heading', { name: /^Log Bars broken at packing/ })).toBeVisible();

  const other = await context.newPage();
  await other.goto(server.url);
  await openLog(other, 'Harbour Foods Filling');
  await other.getByRole('button', { name }).click();
  const otherPanel = other.getByTestId('entry-panel');
  await otherPanel.getByRole('textbox', { name: 'Units inspected', exact: true }).fill('1000');
  await otherPanel.getByRole('textbox', { name: 'Defective units', exact: true }).fill('10');
  await otherPanel.getByRole('button', { name: 'Save study' }).click();
  await expect(other.getByTestId('saved-notice')).toContainText('(created)');

  // The first tab's panel, untouched, now opens on the study as saved there (not a blank form that a save
  // would set beside it).
  await expect(panel.getByRole('heading', { name: /^Correct Bars broken at packing/ })).toBeVisible();
  await expect(panel.getByRole('textbox', { name: 'Units inspected', exact: true })).toHaveValue('1000');
  await expect(panel.getByRole('textbox', { name: 'Defective units', exact: true })).toHaveValue('10');
});

test('logging a month twice asks to replace or combine, and a replace can be undone', async ({ page }) => {
  await loadDemo(page);
  await openLog(page, 'Harbour Foods Filling');
  const open = () =>
    page
      .getByRole('button', { name: /^(Log|Change) Bars broken at packing \(Oat bar baking — oven 1\)/ })
      .click();
  const panel = page.getByTestId('entry-panel');
  await open();
  await panel.getByRole('textbox', { name: 'Units inspected', exact: true }).fill('1000');
  await panel.getByRole('textbox', { name: 'Defective units', exact: true }).fill('10');
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(page.getByTestId('saved-notice')).toContainText('(created)');

  // Correcting starts from the study as saved: its kind and its figures, not a blank form.
  await open();
  await expect(panel.getByRole('heading', { name: /^Correct Bars broken at packing/ })).toBeVisible();
  await expect(panel.getByRole('radio', { name: 'Units good or defective' })).toBeChecked();
  await expect(panel.getByRole('textbox', { name: 'Units inspected', exact: true })).toHaveValue('1000');
  await expect(panel.getByRole('textbox', { name: 'Defective units', exact: true })).toHaveValue('10');
  await panel.getByRole('textbox', { name: 'Defective units', exact: true }).fill('20');
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(panel.getByRole('alert')).toContainText('choose whether to replace that study or combine');
  await panel.getByRole('radio', { name: /Replace it/ }).check();
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(page.getByTestId('saved-notice')).toContainText('(replaced)');
  await expect(row(page, 'Bars broken at packing').filter({ hasText: 'oven 1' })).toContainText('1.000');

  await page.getByTestId('saved-notice').getByRole('button', { name: 'Undo' }).click();
  await expect(
    page.getByText(`Undone: Bars broken at packing for ${MONTH} is back as it was before.`)
  ).toBeVisible();
  await expect(row(page, 'Bars broken at packing').filter({ hasText: 'oven 1' })).toContainText('1.000');

  // Every replaced version stays restorable from the entry panel.
  await open();
  const revisions = panel.getByTestId('revisions');
  await revisions.locator('summary').click();
  await expect(revisions.getByRole('listitem')).toHaveCount(2);
  await revisions.getByRole('button', { name: 'Restore this version' }).first().click();
  await expect(panel.getByText(/Restored the version of/)).toBeVisible();
});
