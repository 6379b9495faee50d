import { DEMO_QUARTER } from './demo-dates';
import { expect, test, type Page } from '@playwright/test';
import { createRequire } from 'node:module';
import { startStaticServer, type RunningServer } from './static-server';
import { drawEveryChart } from './charts-in-view';

/**
 * axe-core (from the registry) over every main page with the demo portfolio loaded: no violation of serious
 * or critical impact. axe is injected as a script, which the app's Content-Security-Policy would refuse, so this
 * test (only this one) lets Playwright bypass the policy; the policy itself has its own test.
 */
test.use({ bypassCSP: true });
const axePath = createRequire(import.meta.url).resolve('axe-core/axe.min.js');

let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => server.stop());

interface AxeResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[];
}

async function seriousViolations(page: Page): Promise<string[]> {
  await page.addScriptTag({ path: axePath });
  const result = await page.evaluate(
    async () =>
      (await (window as unknown as { axe: { run: (c: Document, o: object) => Promise<unknown> } }).axe.run(
        document,
        {
          resultTypes: ['violations']
        }
      )) as AxeResult
  );
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.id} (${v.impact}): ${v.help} — ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(' '))
          .join(', ')}`
    );
}

test('every main page passes an automated accessibility check with no serious violation', async ({
  page
}) => {
  test.setTimeout(120_000);
  const nav = (name: string) => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name });
  await page.goto(server.url);
  expect(await seriousViolations(page), 'start page, empty').toEqual([]);
  // The check can fail: a button without a name is a critical violation.
  await page.evaluate(() =>
    document.body.append(Object.assign(document.createElement('button'), { id: 'nameless' }))
  );
  expect((await seriousViolations(page)).join()).toContain('button-name (critical)');
  await page.evaluate(() => document.getElementById('nameless')?.remove());
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  const pages: [string, () => Promise<void>][] = [
    ['portfolio', async () => undefined],
    [
      'process page',
      async () => {
        await page.getByTestId('portfolio-table').locator('tbody tr').first().locator('a').first().click();
        await drawEveryChart(page);
      }
    ],
    ['process list', async () => nav('Process').click()],
    [
      'monthly log',
      async () => {
        await nav('Monthly log').click();
        await expect(page.getByTestId('open-count')).toBeVisible();
      }
    ],
    [
      'quarterly review',
      async () => {
        await nav('Quarterly review').click();
        await page.getByTestId('quarter').selectOption(DEMO_QUARTER);
        await drawEveryChart(page);
      }
    ],
    [
      'set-up, a process open, master list checked',
      async () => {
        await nav('Set-up').click();
        await page.getByRole('button', { name: 'Camshaft journal grinding — line A', exact: true }).click();
        await expect(page.getByTestId('characteristic-manager')).toBeVisible();
        await page
          .getByTestId('master-paste')
          .fill('site,process,characteristic,data kind\nNorth Ridge Machining,New line,Width,sized');
        await page.getByTestId('master-check').click();
        await expect(page.getByTestId('master-bad-rows')).toBeVisible();
      }
    ],
    ['file exchange', async () => nav('File exchange').click()],
    ['settings', async () => nav('Settings').click()]
  ];
  const found: string[] = [];
  for (const [name, open] of pages) {
    await open();
    await page.waitForTimeout(300);
    for (const v of await seriousViolations(page)) found.push(`${name}: ${v}`);
  }
  expect(found).toEqual([]);
});
