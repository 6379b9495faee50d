import { expect, test, type Page } from '@playwright/test';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { canonicalJson } from '../../src/lib/domain/canonical-json';
import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { drawEveryChart } from './charts-in-view';
import { QUIET_MONTH } from './demo-dates';
import { deviceProfiles, editVehicleKeyTarget, nav } from './device-profiles';
import { startStaticServer, type RunningServer } from './static-server';

/**
 * Two devices in two separate Chromium profiles (own user-data directories, so own IndexedDB): the quality
 * office and a site lead, meeting only through files.
 */
const MONTH = QUIET_MONTH;
let server: RunningServer;
const work = mkdtempSync(join(tmpdir(), 'capstan-exchange-e2e-'));
const profiles = deviceProfiles();

test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => {
  await profiles.closeAll();
  await server.stop();
});
test.afterAll(() => rmSync(work, { recursive: true, force: true }));

const device = (label: string, name: string) => profiles.device(server.url, label, name);

async function toExchange(page: Page) {
  await nav(page, 'File exchange').click();
  await expect(page.getByRole('heading', { name: 'Send a file' })).toBeVisible();
}

/** Saves a file from the exchange page and returns its path on disk. */
async function saveFile(
  page: Page,
  scope: { site?: string; recipient?: string; everything?: true },
  fileLabel: string
): Promise<string> {
  await toExchange(page);
  if (scope.site) {
    await page.getByRole('radio', { name: /One site/ }).check();
    await page.getByTestId('export-site').selectOption({ label: scope.site });
  } else if (scope.recipient) {
    await page.getByRole('radio', { name: /What changed here since the last file/ }).check();
    const option = page.getByTestId('export-peer').locator('option', { hasText: scope.recipient }).first();
    await page.getByTestId('export-peer').selectOption((await option.getAttribute('value'))!);
  } else {
    await page.getByRole('radio', { name: /Everything on this device/ }).check();
  }
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: 'Save the file' }).click()
  ]);
  expect(download.suggestedFilename()).toMatch(/^capstan-.+\.capstan\.json\.gz$/);
  const path = join(work, `${fileLabel}.capstan.json.gz`);
  await download.saveAs(path);
  await expect(page.getByText(/^Saved capstan-/)).toBeVisible();
  return path;
}

/** Opens a file on the exchange page and returns the preview table's text. */
async function openFile(page: Page, path: string) {
  await toExchange(page);
  await page.getByTestId('exchange-file-input').setInputFiles(path);
  await expect(page.getByTestId('import-preview')).toBeVisible();
}

async function confirmMerge(page: Page) {
  await page.getByTestId('confirm-merge').click();
  await expect(page.getByTestId('exchange-done')).toContainText('Merged');
}

function previewCell(page: Page, kind: string, column: number) {
  return page
    .getByTestId('import-preview')
    .locator('tbody tr')
    .filter({ hasText: kind })
    .locator('td')
    .nth(column);
}

async function recordsOf(path: string) {
  return (await decodeExchangeFile(new Uint8Array(readFileSync(path)))).records;
}

/** Same records, kind by kind (a per-kind comparison says where they differ if they do). */
async function expectSameRecords(a: string, b: string) {
  const [x, y] = [await recordsOf(a), await recordsOf(b)];
  for (const kind of Object.keys(x) as (keyof typeof x)[]) {
    expect(canonicalJson(x[kind]), kind).toBe(canonicalJson(y[kind]));
  }
}

test('a site lead and the quality office stay in step through files, and a crossing edit is shown and settled', async () => {
  test.setTimeout(180_000);
  const office = await device('office', 'Quality office');
  await nav(office.page, 'Portfolio').click();
  await office.page.getByTestId('load-demo').click();
  await expect(office.page.getByTestId('portfolio-table')).toBeVisible();
  const setup = await saveFile(office.page, { site: 'North Ridge Machining' }, '1-setup');

  // The site lead receives the site's setup, then works offline.
  const site = await device('site', 'North Ridge lead');
  await openFile(site.page, setup);
  await expect(previewCell(site.page, 'site', 0)).toHaveText('1');
  await confirmMerge(site.page);
  await site.context.setOffline(true);
  await nav(site.page, 'Monthly log').click();
  await site.page.getByTestId('log-site').selectOption({ label: 'North Ridge Machining' });
  await site.page.getByLabel('Reporting month').fill(MONTH);
  await site.page
    .getByRole('button', { name: 'Log Leak rate (Gearbox housing leak test — test bench 1)' })
    .click();
  const panel = site.page.getByTestId('entry-panel');
  await panel.getByRole('textbox', { name: 'n', exact: true }).fill('80');
  await panel.getByRole('textbox', { name: 'Mean', exact: true }).fill('2.31');
  await panel.getByRole('textbox', { name: 'Standard deviation', exact: true }).fill('0.45');
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(site.page.getByTestId('saved-notice')).toContainText(`Saved Leak rate for ${MONTH}`);
  const results = await saveFile(site.page, { recipient: 'Quality office' }, '2-results');

  // The office takes the month's result in, tightens a target and sends the site's file back.
  await openFile(office.page, results);
  await expect(previewCell(office.page, 'study', 0)).toHaveText('1');
  await expect(previewCell(office.page, 'study', 4)).toHaveText('0');
  await confirmMerge(office.page);
  await editVehicleKeyTarget(office.page, '1.9');
  const targets = await saveFile(office.page, { site: 'North Ridge Machining' }, '3-targets');

  await openFile(site.page, targets);
  await expect(previewCell(site.page, 'context profile', 0)).toHaveText('1');
  await confirmMerge(site.page);

  // Same data on both: the site's whole database equals the office's file for that site.
  const siteAll = await saveFile(site.page, { everything: true }, '4-site-all');
  const officeSite = await saveFile(office.page, { site: 'North Ridge Machining' }, '4-office-site');
  await expectSameRecords(siteAll, officeSite);
  const storedTargets = (await recordsOf(siteAll)).contextProfiles;
  expect(storedTargets.map((p) => p.levels.key)).toEqual([1.9]);

  // Both change the same target before meeting again.
  await editVehicleKeyTarget(office.page, '2');
  await editVehicleKeyTarget(site.page, '1.5');
  const crossing = await saveFile(site.page, { recipient: 'Quality office' }, '5-crossing');
  await openFile(office.page, crossing);
  const conflict = office.page.getByTestId('conflict');
  await expect(conflict).toHaveCount(1);
  await expect(conflict).toContainText('Edited on both devices');
  await expect(conflict.locator('tr').filter({ hasText: 'levels' })).toContainText('"key":2');
  await expect(conflict.locator('tr').filter({ hasText: 'levels' })).toContainText('"key":1.5');
  await expect(office.page.getByTestId('confirm-merge')).toBeDisabled();
  await conflict.getByRole('radio', { name: "Take the file's" }).check();
  await confirmMerge(office.page);
  const settled = await saveFile(office.page, { site: 'North Ridge Machining' }, '6-settled');
  await openFile(site.page, settled);
  await expect(site.page.getByTestId('conflict')).toHaveCount(0);
  await confirmMerge(site.page);

  const siteEnd = await saveFile(site.page, { everything: true }, '7-site-all');
  const officeEnd = await saveFile(office.page, { site: 'North Ridge Machining' }, '7-office-site');
  await expectSameRecords(siteEnd, officeEnd);
  expect((await recordsOf(siteEnd)).contextProfiles.map((p) => p.levels.key)).toEqual([1.5]);

  // A bad file is refused with one line and nothing changes.
  const bad = join(work, 'bad.capstan.json');
  writeFileSync(bad, readFileSync(siteEnd).subarray(0, 200));
  await toExchange(site.page);
  await site.page.getByTestId('exchange-file-input').setInputFiles(bad);
  await expect(site.page.getByTestId('exchange-error')).toContainText('Nothing was imported');
  await expect(site.page.getByTestId('backup-status')).toContainText('Last file saved from this device');
});

async function logSummary(page: Page, n: string, mean: string) {
  await nav(page, 'Monthly log').click();
  await page.getByTestId('log-site').selectOption({ label: 'North Ridge Machining' });
  await page.getByLabel('Reporting month').fill(MONTH);
  await page
    .getByRole('button', { name: 'Log Leak rate (Gearbox housing leak test — test bench 1)' })
    .click();
  const panel = page.getByTestId('entry-panel');
  await panel.getByRole('textbox', { name: 'n', exact: true }).fill(n);
  await panel.getByRole('textbox', { name: 'Mean', exact: true }).fill(mean);
  await panel.getByRole('textbox', { name: 'Standard deviation', exact: true }).fill('0.45');
  await panel.getByRole('button', { name: 'Save study' }).click();
  await expect(page.getByTestId('saved-notice')).toContainText(`Saved Leak rate for ${MONTH}`);
}

test('one month logged on two devices is a conflict shown with both studies, and combining keeps one study', async () => {
  test.setTimeout(180_000);
  const office = await device('office', 'Quality office');
  await nav(office.page, 'Portfolio').click();
  await office.page.getByTestId('load-demo').click();
  await expect(office.page.getByTestId('portfolio-table')).toBeVisible();
  const setup = await saveFile(office.page, { site: 'North Ridge Machining' }, 'm1-setup');
  const site = await device('site', 'North Ridge lead');
  await openFile(site.page, setup);
  await confirmMerge(site.page);

  // The site lead logs the month offline; the office, not knowing, logs the same month.
  await site.context.setOffline(true);
  await logSummary(site.page, '60', '2.40');
  await logSummary(office.page, '80', '2.31');
  const results = await saveFile(site.page, { recipient: 'Quality office' }, 'm2-results');

  await openFile(office.page, results);
  const conflict = office.page.getByTestId('conflict');
  await expect(conflict).toHaveCount(1);
  await expect(conflict).toContainText('This month was logged on both devices');
  await expect(conflict).toContainText(
    `Study of ${MONTH}, Leak rate — Gearbox housing leak test — test bench 1 — North Ridge Machining`
  );
  await expect(conflict.locator('tr').filter({ hasText: /^n/ }).first()).toContainText('80');
  await expect(conflict.locator('tr').filter({ hasText: /^n/ }).first()).toContainText('60');
  await expect(conflict.locator('tr').filter({ hasText: 'entered by' })).toContainText('Quality office');
  await expect(conflict.locator('tr').filter({ hasText: 'entered by' })).toContainText('North Ridge lead');
  await expect(office.page.getByTestId('confirm-merge')).toBeDisabled();
  await conflict.getByRole('radio', { name: /Combine both/ }).check();
  await confirmMerge(office.page);

  // One study for the month, with both samples pooled; the process page loads.
  await nav(office.page, 'Portfolio').click();
  await office.page
    .getByTestId('portfolio-table')
    .getByText('Gearbox housing leak test — test bench 1')
    .first()
    .click();
  await expect(office.page.getByRole('heading', { level: 1 })).toContainText('Gearbox housing leak test');
  const back = await saveFile(office.page, { site: 'North Ridge Machining' }, 'm3-office');
  const studies = (await recordsOf(back)).studies.filter((x) => x.period === MONTH && !x.deletedAt);
  expect(studies).toHaveLength(1);
  expect(studies[0]!.data).toMatchObject({ kind: 'summary', n: 140 });

  // The settled month travels back to the site without another question.
  await site.context.setOffline(false);
  await openFile(site.page, back);
  await expect(site.page.getByTestId('conflict')).toHaveCount(0);
  await confirmMerge(site.page);
});

test('text from an imported file is shown as text everywhere, never as markup', async () => {
  test.setTimeout(120_000);
  const { buildMarkupFile } = await import('./markup-file');
  const path = join(work, 'markup.capstan.json');
  writeFileSync(path, await buildMarkupFile());
  const office = await device('markup', 'Office');
  await openFile(office.page, path);
  await confirmMerge(office.page);
  const injected =
    '#x-site, #x-img, #x-img2, #x-script, #x-proc, #x-ch, #x-proj, #x-unit, #x-note, #x-device, img[src="x"]';
  const page = office.page;
  await nav(page, 'Portfolio').click();
  await expect(page.getByTestId('portfolio-table')).toContainText('<b id="x-site">Bold</b> Works<script');
  await expect(page.locator(injected)).toHaveCount(0);
  await page.getByTestId('portfolio-table').getByText('"><b id="x-proc">Casting').first().click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('"><b id="x-proc">Casting');
  await expect(page.getByText('<i id="x-ch">Bore</i>').first()).toBeVisible();
  // Hover every chart so that tooltips are drawn, then look again.
  const charts = page.getByTestId('chart');
  await drawEveryChart(page);
  for (let i = 0; i < (await charts.count()); i++) {
    await charts.nth(i).scrollIntoViewIfNeeded();
    const box = await charts.nth(i).boundingBox();
    if (box) await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.waitForTimeout(150);
    await expect(page.locator(injected)).toHaveCount(0);
  }
  for (const link of ['Monthly log', 'Quarterly review', 'File exchange', 'Settings']) {
    await nav(page, link).click();
    await page.waitForTimeout(300);
    await expect(page.locator(injected)).toHaveCount(0);
  }
  expect(await page.evaluate(() => document.body.dataset.pwned)).toBeUndefined();
});

test('changes in no saved file for longer than the set days bring a reminder, which a saved file clears', async ({
  page
}) => {
  await page.clock.install({ time: new Date('2026-12-01T09:00:00Z') });
  await page.goto(server.url);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  await expect(page.getByTestId('backup-nudge')).toHaveCount(0);
  await nav(page, 'Settings').click();
  await page.getByTestId('reminder-days').fill('3');
  await page.getByRole('button', { name: 'Save reminder' }).click();
  await page.clock.setSystemTime(new Date('2026-12-05T12:00:00Z'));
  await nav(page, 'Portfolio').click();
  await page.reload();
  await expect(page.getByTestId('backup-nudge')).toContainText('the oldest from 4 days ago');
  await nav(page, 'File exchange').click();
  await expect(page.getByTestId('backup-nudge')).toBeVisible();
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: 'Save the file' }).click()
  ]);
  expect(download.suggestedFilename()).toMatch(/\.capstan\.json\.gz$/);
  await expect(page.getByTestId('backup-status')).toContainText('Every change is in a saved file');
  await nav(page, 'Portfolio').click();
  await expect(page.getByTestId('backup-nudge')).toHaveCount(0);
});
