import { expect, test, type Page } from '@playwright/test';
import { addMonths, currentPeriodIn, lastCompletePeriod } from '../../src/lib/domain/period';
import { QUIET_MONTH } from './demo-dates';
import { startStaticServer, waitForServiceWorker, type RunningServer } from './static-server';

/**
 * What a site lead types is read as meant: decimal commas pasted into a browser set to a point-decimal
 * language, a block that could be read two ways is asked about, figures far outside the limits are questioned
 * before saving, and months that have not begun cannot be logged.
 */
test.use({ locale: 'en-GB' });

let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => server.stop());

async function openRoughness(page: Page, month: string) {
  await page.goto(server.url);
  await waitForServiceWorker(page);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  await page.getByRole('link', { name: 'Monthly log' }).click();
  await page.getByTestId('log-site').selectOption({ label: 'North Ridge Machining' });
  await page.getByLabel('Reporting month').fill(month);
  await page
    .getByRole('button', { name: 'Log Surface roughness Ra (Camshaft journal grinding — line A)' })
    .click();
  const panel = page.getByTestId('entry-panel');
  await panel.getByRole('radio', { name: 'Individual measured values' }).check();
  return panel;
}

test('pasted decimal commas are read as decimals in a point-decimal browser; 1,234 is asked about', async ({
  page
}) => {
  const panel = await openRoughness(page, QUIET_MONTH);
  const values = panel.getByRole('textbox', { name: /Values/ });
  await values.fill(['0,213', '0,198', '0,207', '0,221', '0,215', '0,209'].join('\n'));
  await expect(page.getByTestId('raw-summary')).toHaveText('Read 6 values, with a decimal comma.');
  await expect(page.getByTestId('implausible-entry')).toHaveCount(0);

  // Three digits after one comma: the block does not say which mark it uses, so the page asks.
  await values.fill(['1,234', '1,250', '1,241'].join('\n'));
  const ask = page.getByTestId('ask-decimal');
  await expect(ask).toContainText("How should '1,234' be read?");
  await ask.getByRole('radio', { name: /Decimal point: '1,234' is 1234/ }).check();
  // Read with a point, the values are thousands of µm against a limit of 0.4: the save is questioned.
  await expect(page.getByTestId('implausible-entry')).toContainText('far outside the limits');
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(panel.getByRole('alert')).toContainText('These figures are right');
  await expect(page.getByTestId('saved-notice')).toHaveCount(0);
  // Read with a comma, they are plausible and save without a question.
  await ask.getByRole('radio', { name: /Decimal comma: '1,234' is 1.234/ }).check();
  await expect(page.getByTestId('implausible-entry')).toHaveCount(0);
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(page.getByTestId('saved-notice')).toContainText(
    `Saved Surface roughness Ra for ${QUIET_MONTH} (created)`
  );
});

test('a month that has not begun cannot be logged, and the portfolio ends at the last complete month', async ({
  page
}) => {
  await page.goto(server.url);
  await waitForServiceWorker(page);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  await expect(page.getByText(`ending ${lastCompletePeriod()}`).first()).toBeVisible();

  await page.getByRole('link', { name: 'Monthly log' }).click();
  await page.getByTestId('log-site').selectOption({ label: 'North Ridge Machining' });
  const current = currentPeriodIn('Europe/Berlin');
  await page.getByLabel('Reporting month').fill(current);
  await expect(page.getByRole('button', { name: 'Later month ›' })).toBeDisabled();
  const future = addMonths(current, 2);
  await page.getByLabel('Reporting month').fill(future);
  await expect(page.getByTestId('future-month')).toContainText(
    `${future} has not begun yet at North Ridge Machining`
  );
  await expect(page.getByRole('button', { name: /^Log / })).toHaveCount(0);
});
