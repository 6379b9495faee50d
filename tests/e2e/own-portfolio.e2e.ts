import { expect, test, type Page } from '@playwright/test';
import { lastCompletePeriod } from '../../src/lib/domain/period';
import { startStaticServer, waitForServiceWorker } from './static-server';
import { drawnChart } from './charts-in-view';

/**
 * A company's own portfolio from an empty profile, offline: sites, processes and characteristics by hand, a
 * 200-row master list with bad rows named by line and then fixed, a limit change from a month, a logged month,
 * the ranking, a project started and advanced, and the demo loaded and removed without touching any of it.
 * Every name is invented.
 */
const MONTH = lastCompletePeriod();

const SITES = [
  { name: 'Kestrel Bay Works', zone: 'Europe/Lisbon' },
  { name: 'Amberfield Plant', zone: 'America/Toronto' }
];
const PROCESSES = [
  { site: 'Kestrel Bay Works', name: 'Valve body boring', context: 'Vehicle parts' },
  { site: 'Kestrel Bay Works', name: 'Seal ring moulding', context: 'Vehicle parts' },
  { site: 'Amberfield Plant', name: 'Pouch filling', context: 'Packaged goods, net content' }
];
const CHARACTERISTICS = [
  { process: 'Valve body boring', name: 'Bore diameter', lsl: '11.98', target: '12', usl: '12.02' },
  { process: 'Valve body boring', name: 'Bore depth', lsl: '30.9', target: '31', usl: '31.1' },
  { process: 'Seal ring moulding', name: 'Ring thickness', lsl: '2.35', target: '2.4', usl: '2.45' },
  { process: 'Seal ring moulding', name: 'Ring inner diameter', lsl: '18.9', target: '19', usl: '19.1' },
  { process: 'Pouch filling', name: 'Fill weight', lsl: '498', target: '502', usl: '510' }
];

/** 200 rows: two more sites, 40 processes of 5 characteristics; `bad` lines (1-based, header = 1) broken. */
function masterList(bad: Set<number>): string {
  const lines = [
    'site,time zone,region,process,owner,context,monthly volume,cost per defective,currency,characteristic,unit,data kind,lsl,target,usl,risk class'
  ];
  for (let i = 0; i < 200; i++) {
    const line = i + 2;
    const site = i < 100 ? 'Osprey Ridge Site' : 'Larchmont Yard';
    const zone = i < 100 ? 'Europe/Madrid' : 'America/Denver';
    const process = `Line ${Math.floor(i / 5) + 1}`;
    const lsl = bad.has(line) && line === 12 ? '5.2' : '4.8';
    const context = bad.has(line) && line === 57 ? 'deep-sea-mining' : 'vehicle-parts';
    const risk = bad.has(line) && line === 140 ? 'extreme' : 'standard';
    lines.push(
      `${site},${zone},,${process},P. Quill,${context},5000,2.5,EUR,Feature ${(i % 5) + 1},mm,measured,${lsl},5,5.2,${risk}`
    );
  }
  return lines.join('\n');
}

const nav = (page: Page, name: string) =>
  page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name, exact: true });

async function addProcess(page: Page, p: (typeof PROCESSES)[number]) {
  const form = page.getByTestId('process-form');
  await form.locator('select').first().selectOption({ label: p.site });
  await form.getByLabel('Process name').fill(p.name);
  await form.getByLabel('Owner').fill('D. Ferreira');
  await form.locator('select').nth(1).selectOption({ label: p.context });
  await form.getByLabel('Monthly volume (units)').fill('12000');
  await form.getByLabel('Cost per defective unit').fill('8.5');
  await form.getByLabel('Currency (ISO code)').fill('EUR');
  await form.getByRole('button', { name: 'Add process' }).click();
  await expect(page.getByText(`Added process “${p.name}”.`)).toBeVisible();
}

test('a company sets up its own portfolio offline from an empty profile and keeps it after the demo is removed', async ({
  page,
  context
}) => {
  test.setTimeout(180_000);
  const server = await startStaticServer();
  await page.goto(server.url);
  await waitForServiceWorker(page);
  await server.stop();
  await context.setOffline(true);

  // Empty: the portfolio says what to do first.
  await expect(page.getByRole('link', { name: 'Set up your own portfolio' })).toBeVisible();
  await page.getByRole('link', { name: 'Set up your own portfolio' }).click();
  await expect(page.getByTestId('setup-next')).toContainText('Add your first site');

  // Two sites, a bad entry first (named beside its field).
  await page.getByLabel('Site name').fill('Kestrel Bay Works');
  await page.getByLabel('Time zone').fill('Mars/Olympus');
  await page.getByRole('button', { name: 'Add site' }).click();
  await expect(page.getByText("'Mars/Olympus' is not a known time zone")).toBeVisible();
  for (const s of SITES) {
    await page.getByLabel('Site name').fill(s.name);
    await page.getByLabel('Time zone').fill(s.zone);
    await page.getByRole('button', { name: 'Add site' }).click();
    await expect(page.getByTestId('site-list')).toContainText(s.name);
  }
  await expect(page.getByTestId('setup-next')).toContainText('add a process');

  // Three processes and five characteristics, by hand.
  for (const p of PROCESSES) {
    await addProcess(page, p);
    const manager = page.getByTestId('characteristic-manager');
    for (const c of CHARACTERISTICS.filter((x) => x.process === p.name)) {
      const form = manager.getByTestId('characteristic-form');
      await form.getByLabel('Characteristic name').fill(c.name);
      await form.getByLabel('Unit').fill(p.name === 'Pouch filling' ? 'g' : 'mm');
      await form.getByLabel('LSL').fill(c.lsl);
      await form.getByLabel('Target').fill(c.target);
      await form.getByLabel('USL').fill(c.usl);
      await form.getByRole('button', { name: 'Add characteristic' }).click();
      await expect(manager.getByText(`Added “${c.name}”.`)).toBeVisible();
    }
  }
  // A bad characteristic is refused beside its field.
  const form = page.getByTestId('characteristic-manager').getByTestId('characteristic-form');
  await form.getByLabel('Characteristic name').fill('Seal width');
  await form.getByLabel('LSL').fill('3');
  await form.getByLabel('USL').fill('2');
  await form.getByRole('button', { name: 'Add characteristic' }).click();
  await expect(page.getByText('USL (2) must be greater than LSL (3)')).toBeVisible();
  await expect(page.getByTestId('setup-next')).toHaveCount(0);

  // A 200-row master list: three bad rows, named by line; then fixed and imported.
  await page.getByTestId('master-paste').fill(masterList(new Set([12, 57, 140])));
  await page.getByTestId('master-check').click();
  await expect(page.getByTestId('master-bad-count')).toContainText('3 bad rows');
  const bad = page.getByTestId('master-bad-rows');
  await expect(bad).toContainText('line 12');
  await expect(bad).toContainText('USL (5.2) must be greater than LSL (5.2)');
  await expect(bad).toContainText("line 57: context: 'deep-sea-mining' is not a known industry context");
  await expect(bad).toContainText("line 140: risk class: 'extreme'");
  await expect(page.getByTestId('master-apply')).toBeDisabled();
  await page.getByTestId('master-paste').fill(masterList(new Set()));
  await page.getByTestId('master-check').click();
  await expect(page.getByTestId('master-counts')).toContainText(
    'Would add 2 sites, 40 processes and 200 characteristics'
  );
  await page.getByTestId('master-apply').click();
  await expect(page.getByTestId('master-applied')).toContainText('200 new characteristics');

  // Limits of the bore diameter tightened from the month about to be logged.
  await page.getByRole('button', { name: 'Valve body boring', exact: true }).click();
  await page.getByRole('button', { name: 'Change limits of Bore diameter' }).click();
  const change = page.getByTestId('limit-change-form');
  await change.getByLabel('From month').fill(MONTH);
  await change.getByLabel('LSL').fill('11.985');
  await change.getByLabel('USL').fill('12.015');
  await change.getByLabel('Reason').fill('drawing revision C');
  await change.getByRole('button', { name: 'Save the new limits' }).click();
  await expect(page.getByText(`New limits for “Bore diameter” from ${MONTH}`)).toBeVisible();

  // Log the month for the bore diameter: a summary.
  await nav(page, 'Monthly log').click();
  await page.getByTestId('log-site').selectOption({ label: 'Kestrel Bay Works' });
  await page.getByLabel('Reporting month').fill(MONTH);
  await page.getByRole('button', { name: 'Log Bore diameter (Valve body boring)' }).click();
  const panel = page.getByTestId('entry-panel');
  await panel.getByRole('textbox', { name: 'n', exact: true }).fill('125');
  await panel.getByRole('textbox', { name: 'Mean', exact: true }).fill('12.004');
  await panel.getByRole('textbox', { name: 'Standard deviation', exact: true }).fill('0.0042');
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(page.getByTestId('saved-notice')).toContainText(`Saved Bore diameter for ${MONTH}`);

  // The portfolio ranks every process: 3 by hand and 40 from the list.
  await nav(page, 'Portfolio').click();
  const table = page.getByTestId('portfolio-table');
  await expect(table.locator('tbody tr')).toHaveCount(43);
  const boring = table.locator('tbody tr').filter({ hasText: 'Valve body boring' }).first();
  await expect(boring).not.toContainText('no recent data');

  // Start a project with the options side by side, then advance it on the process page.
  await boring.getByRole('button', { name: 'Details of Valve body boring' }).click();
  await page.getByTestId('create-project').click();
  const options = page.getByTestId('improvement-options');
  await expect(options).toContainText('centring alone');
  await expect(options).toContainText('less spread alone');
  await page.getByTestId('start-project').getByLabel('Title').fill('Centre the bore');
  await page.getByTestId('confirm-start-project').click();
  await expect(page.getByText('Started the project “Centre the bore” (Define phase)')).toBeVisible();
  await page.getByTestId('row-detail').getByRole('link', { name: 'Valve body boring' }).click();
  // The logged month's figures, computed by the page's worker from the company's own record.
  await expect(page.getByTestId('figures-pending')).toHaveCount(0);
  await expect(page.locator('td[data-label="Yield"]').first()).toBeVisible();
  await drawnChart(page.getByTestId('chart').first());
  const viewport = page.viewportSize();
  for (const [width, height] of [
    [1366, 900],
    [390, 844]
  ] as const) {
    await page.setViewportSize({ width, height });
    await page.screenshot({ path: `tests/e2e/.output/pages/${width}-own-process-page.png`, fullPage: true });
  }
  if (viewport) await page.setViewportSize(viewport);
  await expect(page.getByTestId('limit-history')).toContainText(`From ${MONTH}`);
  await expect(page.getByTestId('limit-history')).toContainText('drawing revision C');
  await page.getByRole('button', { name: 'Edit project Centre the bore' }).click();
  await page.getByTestId('project-phase').selectOption('Measure');
  await page.getByRole('button', { name: 'Save the project' }).click();
  const project = page.getByTestId('project');
  await expect(project.locator('.tag')).toHaveText('Measure');
  await project.getByText(/History/).click();
  await expect(project).toContainText('phase Define → Measure');

  // The demo, loaded beside the company's records and removed in one action.
  await nav(page, 'Set-up').click();
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('demo-banner')).toBeVisible();
  await expect(page.getByTestId('site-list')).toContainText('North Ridge Machining');
  await page.getByTestId('remove-demo').click();
  await page.getByTestId('confirm-remove-demo').click();
  await expect(page.getByTestId('demo-removed')).toContainText('5 sites');
  await expect(page.getByTestId('demo-banner')).toHaveCount(0);
  const sites = page.getByTestId('site-list');
  await expect(sites).not.toContainText('North Ridge Machining');
  for (const name of ['Kestrel Bay Works', 'Amberfield Plant', 'Osprey Ridge Site', 'Larchmont Yard'])
    await expect(sites).toContainText(name);
  await nav(page, 'Portfolio').click();
  await expect(table.locator('tbody tr')).toHaveCount(43);
});
