import { DEMO_QUARTER } from './demo-dates';
import { expect, test } from '@playwright/test';
import { startStaticServer, waitForServiceWorker, type RunningServer } from './static-server';
import { drawEveryChart } from './charts-in-view';

/**
 * The built app's Content-Security-Policy (a meta tag in every page: scripts from this origin only, no eval, no
 * remote origins) holds during a full tour: every area, charts, the workers that read and write files, a
 * download. Any violation the browser reports — as an event in the page or a console message from a page or
 * worker — fails the test.
 */
let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => server.stop());

test('a full tour of the app raises no Content-Security-Policy violation', async ({ page }) => {
  test.setTimeout(90_000);
  const violations: string[] = [];
  await page.exposeFunction('reportViolation', (text: string) => violations.push(text));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) =>
      (window as unknown as { reportViolation: (t: string) => void }).reportViolation(
        `${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} at ${e.sourceFile}:${e.lineNumber}`
      )
    );
  });
  page.on('console', (m) => {
    if (/Content Security Policy|Refused to/i.test(m.text())) violations.push(`console: ${m.text()}`);
  });
  const nav = (name: string) => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name });

  await page.goto(server.url);
  await waitForServiceWorker(page);
  expect(await page.locator('meta[http-equiv="content-security-policy"]').getAttribute('content')).toMatch(
    /script-src 'self' 'sha256-[^']+'(;|$)/
  );
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  await page.getByTestId('portfolio-table').locator('tbody tr').first().locator('a').first().click();
  await drawEveryChart(page);
  await nav('Monthly log').click();
  await expect(page.getByTestId('open-count')).toBeVisible();
  await nav('Quarterly review').click();
  await page.getByTestId('quarter').selectOption(DEMO_QUARTER);
  await drawEveryChart(page);
  await nav('File exchange').click();
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: 'Save the file' }).click()
  ]);
  const path = await download.path();
  await page.getByTestId('exchange-file-input').setInputFiles(path);
  await expect(page.getByTestId('import-preview')).toBeVisible();
  await nav('Settings').click();
  await expect(page.getByTestId('usage')).toBeVisible();
  // A deep link loads through the fallback page, which carries the policy too.
  await page.goto(`${server.url}/process`);
  await expect(page.locator('meta[http-equiv="content-security-policy"]')).toHaveCount(1);
  expect(violations).toEqual([]);
});
