import { DEMO_QUARTER, demoAsLoaded } from './demo-dates';
import { expect, test } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { startStaticServer, type RunningServer } from './static-server';
import { drawnChart } from './charts-in-view';

const demo = JSON.parse(
  readFileSync(new URL('../../seed-data/demo-portfolio.json', import.meta.url), 'utf8')
) as {
  records: {
    processes: { id: string; name: string }[];
    characteristics: { processId: string; name: string }[];
  };
};

let server: RunningServer;
test.beforeAll(async () => {
  server = await startStaticServer();
});
test.afterAll(async () => {
  await server.stop();
});

test('loads the demo portfolio and lists every process; a click opens its process page', async ({ page }) => {
  await page.goto(server.url);
  await page.getByTestId('load-demo').click();
  const rows = page.getByTestId('portfolio-table').locator('tbody tr');
  await expect(rows).toHaveCount(demo.records.processes.length);
  await expect(page.getByTestId('portfolio-summary')).toContainText(
    `${demo.records.processes.length} processes at 5 sites`
  );

  const target = demo.records.processes[0]!;
  await page.getByRole('link', { name: target.name, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(target.name);
  for (const c of demo.records.characteristics.filter((x) => x.processId === target.id)) {
    await expect(page.getByRole('heading', { name: `${c.name}: monthly studies` })).toBeVisible();
    // The latest month's figures come with their assumptions and the caution.
    const figures = page.getByRole('region', {
      name: new RegExp(`Capability figures: ${c.name}, latest month`)
    });
    await expect(figures).toContainText('z-level, long-term (one-tail equivalent)');
    await expect(figures.getByRole('heading', { name: 'Assumptions' })).toBeVisible();
    await expect(figures).toContainText('qualified people prevail');
  }
  // Any month's figures and charts are reachable, not only the latest.
  const loaded = demoAsLoaded().records;
  const first = loaded.characteristics.find((x) => x.processId === target.id)!;
  const older = loaded.studies
    .filter((s) => s.characteristicId === first.id)
    .map((s) => s.period)
    .sort()
    .at(-3)!;
  await page.getByRole('button', { name: `Figures and charts of ${first.name} for ${older}` }).click();
  await expect(
    page.getByRole('region', { name: `Capability figures: ${first.name}, ${older}` })
  ).toBeVisible();
  await expect(page.getByRole('button', { name: `Download ${older} as CSV` })).toBeVisible();
});

test('every area of the navigation shows stored data, and charts arrive only when a page needs them', async ({
  page
}) => {
  const scripts: string[] = [];
  page.on('response', (r) => {
    if (r.request().resourceType() === 'script') scripts.push(r.url());
  });
  await page.goto(server.url);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  const beforeReview = scripts.length;

  await page.getByRole('link', { name: 'Monthly log' }).click();
  await expect(page.getByTestId('open-count')).toContainText('characteristics');

  await page.getByRole('link', { name: 'Quarterly review' }).click();
  await page.getByTestId('quarter').selectOption(DEMO_QUARTER);
  await expect(page.getByTestId('reporting-share')).toContainText('%');
  await drawnChart(page.getByTestId('chart').first());
  expect(scripts.length).toBeGreaterThan(beforeReview);

  await page.getByRole('link', { name: 'File exchange' }).click();
  await expect(page.getByTestId('record-counts')).toContainText('Studies');

  await page.getByRole('link', { name: 'Settings' }).click();
  await expect(page.getByTestId('persistence')).toContainText(/granted|not supported/);
  await expect(page.getByTestId('usage')).toContainText('available to this site');
});

test('the navigation works from the keyboard alone', async ({ page }) => {
  await page.goto(server.url);
  await page.keyboard.press('Tab');
  await expect(page.getByRole('link', { name: 'Skip to content' })).toBeFocused();
  // brand, then the areas in order
  await page.keyboard.press('Tab');
  await page.keyboard.press('Tab');
  await expect(page.getByRole('link', { name: 'Portfolio', exact: true })).toBeFocused();
  await page.keyboard.press('Tab');
  await page.keyboard.press('Enter');
  await expect(page).toHaveURL(/\/process$/);
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Process');
});
