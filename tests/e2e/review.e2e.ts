import { expect, test, type Locator, type Page } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { periodsOfQuarter } from '../../src/lib/domain/period';
import { drawEveryChart, drawnChart } from './charts-in-view';
import { DEMO_QUARTER, demoAsLoaded } from './demo-dates';
import { rankPortfolio } from '../../src/lib/domain/portfolio-ranking';
import { startStaticServer, type RunningServer } from './static-server';

/**
 * The quarterly review of a demo quarter: headline figures against counts made here from the same data, a
 * section note, printing to PDF through Chromium (sections, pages, a rendered page that is not blank), and a
 * frozen snapshot that notices later changes.
 */
const QUARTER = DEMO_QUARTER;
let server: RunningServer;
const work = mkdtempSync(join(tmpdir(), 'capstan-review-e2e-'));
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => server.stop());
test.afterAll(() => rmSync(work, { recursive: true, force: true }));

/** Independent of the review code: the portfolio ranking for the quarter's three months, counted by hand. */
function expectedHeadline() {
  const demo = demoAsLoaded();
  const rows = rankPortfolio(demo.records, BUILT_IN_PROFILES, {
    endPeriod: periodsOfQuarter(QUARTER)[2]!,
    windowMonths: 3
  });
  const reviewed = rows.filter((r) => r.status !== 'no recent data');
  const meeting = reviewed.filter(
    (r) => r.status === 'meets, shown' || r.status === 'meets, not shown'
  ).length;
  const shown = reviewed.filter((r) => r.status === 'meets, shown').length;
  return {
    processes: rows.length,
    reviewed: reviewed.length,
    share: `${Math.round((100 * meeting) / reviewed.length)} %`,
    shown: `${Math.round((100 * shown) / reviewed.length)} %`
  };
}

async function openReview(page: Page) {
  await page.goto(server.url);
  await page.getByTestId('load-demo').click();
  await expect(page.getByTestId('portfolio-table')).toBeVisible();
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Quarterly review' })
    .click();
  await page.getByTestId('quarter').selectOption(QUARTER);
  await expect(page.getByTestId('headline')).toBeVisible();
}

test('the review of a demo quarter shows the right headline, keeps a note and prints as a multi-page PDF', async ({
  page
}) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1100, height: 900 });
  await openReview(page);
  const expected = expectedHeadline();
  await expect(page.getByTestId('headline-reviewed')).toHaveText(String(expected.reviewed));
  await expect(page.getByTestId('headline')).toContainText(`of ${expected.processes} processes reviewed`);
  await expect(page.getByTestId('headline-share')).toHaveText(expected.share);
  await expect(page.getByTestId('headline-share-shown')).toHaveText(expected.shown);

  // A note is saved with the review and survives a reload.
  await page.getByTestId('note-headline').fill('Share meeting target held; cost fell at two sites.');
  await page.getByTestId('note-headline').blur();
  await expect(page.getByTestId('section-headline').getByText('Saved.')).toBeVisible();
  await page.reload();
  await page.getByTestId('quarter').selectOption(QUARTER);
  await expect(page.getByTestId('note-headline')).toHaveValue(
    'Share meeting target held; cost fell at two sites.'
  );

  // The sections after the headline are drawn one per task: counted once none is still waiting, or the count
  // can be taken while the last ones are still coming. A chart is drawn only in or near the view: the last one,
  // pages below, waits (busy, with no drawing) until the reader comes to it.
  await expect(page.getByRole('status').filter({ hasText: 'Drawing this section' })).toHaveCount(0);
  const charts = page.getByTestId('chart');
  const count = await charts.count();
  expect(count).toBeGreaterThanOrEqual(6);
  const last = charts.last();
  await page.waitForTimeout(500);
  await expect(last).toHaveAttribute('aria-busy', 'true');
  await expect(last.locator('svg')).toHaveCount(0);
  await last.scrollIntoViewIfNeeded();
  await expect(last.locator('svg')).toHaveCount(1);
  await expect(last).toHaveAttribute('aria-busy', 'false');
  await page.evaluate(() => window.scrollTo(0, 0));

  // A chart as SVG and as PNG, a table as CSV.
  const saved = async (trigger: () => Promise<void>) => {
    const [download] = await Promise.all([page.waitForEvent('download'), trigger()]);
    return {
      name: download.suggestedFilename(),
      bytes: Buffer.concat(await (await download.createReadStream()).toArray())
    };
  };
  const section = page.getByTestId('section-shortfalls');
  await drawnChart(section.getByTestId('chart').first());
  const svg = await saved(() =>
    section
      .getByRole('button', { name: /as SVG$/ })
      .first()
      .click()
  );
  expect(svg.name).toBe(`capstan-review-${QUARTER}-z-against-target.svg`);
  expect(svg.bytes.toString('utf8')).toMatch(/^<svg[^>]+xmlns="http:\/\/www.w3.org\/2000\/svg"/);
  const png = await saved(() =>
    section
      .getByRole('button', { name: /as PNG$/ })
      .first()
      .click()
  );
  expect(png.name).toBe(`capstan-review-${QUARTER}-z-against-target.png`);
  expect([...png.bytes.subarray(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
  const csv = await saved(() =>
    page.getByRole('button', { name: `Download capstan-review-${QUARTER}-shortfalls.csv` }).click()
  );
  expect(csv.bytes.toString('utf8').split('\r\n')[0]).toBe(
    'rank,process,site,z-level,z-level basis,required z,gap,ppm,cost per year,currency,weakest,what would help'
  );

  // The sites chart in figures: five numbers per site, its median the sites table's, and the CSV of every
  // z-level holds as many rows as the sites' counts add up to.
  const spread = page.getByTestId('site-spread-table');
  const spreadRows = await spread
    .locator('tbody tr')
    .evaluateAll((rows) => rows.map((r) => [...r.children].map((c) => c.textContent?.trim() ?? '')));
  const siteRows = await page
    .getByTestId('sites-table')
    .locator('tbody tr')
    .evaluateAll((rows) => rows.map((r) => [...r.children].map((c) => c.textContent?.trim() ?? '')));
  expect(spreadRows.map((r) => [r[0], r[4]])).toEqual(siteRows.map((r) => [r[0], r[4]]));
  const zCount = spreadRows.reduce((sum, r) => sum + Number(r[1]), 0);
  expect(zCount).toBeGreaterThan(0);
  const zCsv = await saved(() =>
    page
      .getByRole('button', { name: `CSV of every z-level: download capstan-review-${QUARTER}-z-levels.csv` })
      .click()
  );
  const zLines = zCsv.bytes.toString('utf8').trim().split('\r\n');
  expect(zLines[0]).toBe('site,process,z-level,z-level basis,status');
  expect(zLines.length - 1).toBe(zCount);

  // Printed with charts not yet scrolled to: printing draws every chart.
  const pdfPath = join(work, 'review.pdf');
  await page.evaluate(() => window.scrollTo(0, 0));
  const undrawn = await page.locator('[data-testid="chart"][aria-busy="true"]').count();
  expect(undrawn).toBeGreaterThan(0);
  writeFileSync(pdfPath, await page.pdf({ format: 'A4', printBackground: true }));
  await expect(page.locator('[data-testid="chart"] svg')).toHaveCount(count);
  await expect(page.locator('[data-testid="chart"][aria-busy="true"]')).toHaveCount(0);
  if (process.env.CAPSTAN_KEEP_PDF) writeFileSync(process.env.CAPSTAN_KEEP_PDF, readFileSync(pdfPath));
  const info = execFileSync('pdfinfo', [pdfPath], { encoding: 'utf8' });
  const pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
  expect(pages).toBeGreaterThanOrEqual(6);
  const text = execFileSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' });
  for (const heading of [
    `Capstan · Quarterly portfolio review ${QUARTER}`,
    `Where we stand, ${QUARTER}`,
    'Shortfalls and what they cost',
    'What moved',
    'Sites',
    'Improvement pipeline',
    'Assumptions and data quality',
    'Share meeting target held; cost fell at two sites.'
  ]) {
    expect(text, heading).toContain(heading);
  }
  // Screen-only controls stay off paper.
  expect(text).not.toContain('Print or save as PDF');
  expect(text).not.toContain('Comment for this section');
  // Each section starts a page: the shortfalls heading is not on the first page.
  const firstPage = execFileSync('pdftotext', ['-f', '1', '-l', '1', pdfPath, '-'], { encoding: 'utf8' });
  expect(firstPage).toContain(`Where we stand, ${QUARTER}`);
  expect(firstPage).not.toContain('Shortfalls and what they cost');

  // A page with a chart (the shortfalls section) rendered to PNG is not blank.
  execFileSync('pdftoppm', [
    '-png',
    '-r',
    '40',
    '-f',
    '2',
    '-l',
    '2',
    '-singlefile',
    pdfPath,
    join(work, 'page')
  ]);
  const pagePng = readFileSync(join(work, 'page.png')).toString('base64');
  const inked = await page.evaluate(async (data) => {
    const img = new Image();
    img.src = `data:image/png;base64,${data}`;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = img.width;
    canvas.height = img.height;
    const g = canvas.getContext('2d')!;
    g.drawImage(img, 0, 0);
    const px = g.getImageData(0, 0, img.width, img.height).data;
    let dark = 0;
    for (let i = 0; i < px.length; i += 4) if (px[i]! + px[i + 1]! + px[i + 2]! < 600) dark += 1;
    return { dark, total: px.length / 4 };
  }, pagePng);
  expect(inked.dark / inked.total).toBeGreaterThan(0.01);
});

test('a frozen review keeps its figures and says when the live data has moved on', async ({ page }) => {
  await openReview(page);
  const share = await page.getByTestId('headline-share').textContent();
  await page.getByTestId('freeze-review').click();
  await expect(page.getByTestId('snapshot-status')).toContainText(
    'The live data still gives the same figures'
  );

  // Much stricter service targets change the live statuses.
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click();
  await page.getByRole('button', { name: 'Edit targets of Transactional and service work' }).click();
  await page.getByTestId('profile-form').locator('input[name="level-standard"]').fill('7');
  await page.getByTestId('profile-form').locator('input[name="level-key"]').fill('7');
  await page.getByTestId('profile-form').locator('input[name="level-safety"]').fill('7');
  await page.getByRole('button', { name: 'Save targets' }).click();
  await expect(page.getByText('Saved the targets of Transactional and service work')).toBeVisible();

  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Quarterly review' })
    .click();
  await page.getByTestId('quarter').selectOption(QUARTER);
  await expect(page.getByTestId('snapshot-status')).toContainText(
    'The live data now differs in: headline figures'
  );
  await expect(page.getByTestId('headline-share')).toHaveText(share!);
  await page.getByRole('button', { name: 'Unfreeze: show live figures' }).click();
  await expect(page.getByTestId('snapshot-status')).toHaveCount(0);
  await expect(page.getByTestId('headline-share')).not.toHaveText(share!);
});

test('another quarter chosen: every chart is drawn again, for that quarter', async ({ page }) => {
  await openReview(page);
  const charts = page.getByTestId('chart');
  const trend = page
    .locator('figure')
    .filter({ hasText: 'Share of reviewed processes meeting their target' })
    .locator('[data-testid="chart"]');
  // The trend's quarters as its axis writes them: the last one is the quarter reviewed.
  const axisQuarters = async () =>
    (await trend.locator('svg text').allTextContents()).filter((t) => /^\d{4}-Q[1-4]$/.test(t));
  await drawnChart(trend);
  await expect.poll(async () => (await axisQuarters()).at(-1)).toBe(QUARTER);
  // A year back. Each section after the headline takes the new figures in a task of its own, and each chart draws
  // them in a task of its own (ChartPanel), each busy until then: none may be left showing the quarter before.
  const earlier = `${Number(QUARTER.slice(0, 4)) - 1}${QUARTER.slice(4)}`;
  await page.getByTestId('quarter').selectOption(earlier);
  await expect(page.getByTestId('headline-table')).toContainText(`${earlier} (this quarter)`);
  await expect(page.locator('section[aria-busy="true"]')).toHaveCount(0);
  // The charts in view take the new quarter at once; those further down as the reader comes to them.
  await expect.poll(async () => (await axisQuarters()).at(-1)).toBe(earlier);
  expect(await drawEveryChart(page)).toBe(await charts.count());
  await expect(page.locator('[data-testid="chart"][aria-busy="true"]')).toHaveCount(0);
  await expect(page.locator('[data-testid="chart"] svg')).toHaveCount(await charts.count());
  expect((await axisQuarters()).at(-1)).toBe(earlier);
  expect(await axisQuarters()).not.toContain(QUARTER);
});

/** The level texts of a drawn chart (slanted ones left out) that overlap another, after a count of them. */
function overlappingTexts(svg: Locator): Promise<string[]> {
  return svg.evaluate((element) => {
    const boxes = [...element.querySelectorAll('text')]
      .filter((t) => {
        const m = (t as SVGGraphicsElement).getCTM();
        return t.textContent?.trim() && m && Math.abs(m.b) < 1e-6 && Math.abs(m.c) < 1e-6;
      })
      .map((t) => ({ text: t.textContent!.trim(), box: t.getBoundingClientRect() }));
    const found: string[] = [`${boxes.length > 8 ? 'several' : 'too few'} level texts`];
    for (const [k, a] of boxes.entries())
      for (const b of boxes.slice(k + 1)) {
        const p = a.box;
        const q = b.box;
        if (p.left + 1 < q.right && q.left + 1 < p.right && p.top + 1 < q.bottom && q.top + 1 < p.bottom)
          found.push(`"${a.text}" over "${b.text}"`);
      }
    return found;
  });
}

test('on a phone, the cost charts write their legend clear of their axis names', async ({ page }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 390, height: 844 });
  await openReview(page);
  const costCharts = page
    .locator('figure')
    .filter({ has: page.locator('figcaption', { hasText: /^Cost of poor quality per year/ }) });
  const count = await costCharts.count();
  // The demo reports costs in three currencies: one chart each.
  expect(count).toBe(3);
  for (let i = 0; i < count; i += 1) {
    const svg = await drawnChart(costCharts.nth(i).locator('[data-testid="chart"]'));
    // Drawn: the right axis's name is written.
    await expect(svg.locator('text').filter({ hasText: /^%$/ })).toHaveCount(1);
    // Every text the chart writes level (the process names below are slanted on purpose): no two may overlap.
    expect(await overlappingTexts(svg)).toEqual(['several level texts']);
  }
});

test('on a phone, the z-level chart leaves its bars room beside the names, and the movement chart names its axes within it', async ({
  page
}) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 390, height: 844 });
  await openReview(page);
  const chart = page
    .locator('figure')
    .filter({ has: page.locator('figcaption', { hasText: /^z-level against the required level/ }) })
    .locator('[data-testid="chart"]');
  const svg = await drawnChart(chart);
  await expect(svg.locator('text').filter({ hasText: /^z-level$/ })).toHaveCount(1);
  // The names once took all but a few pixels: the scale's numbers ran into one another and the bars were slivers.
  expect(await overlappingTexts(svg)).toEqual(['several level texts']);
  const room = await svg.evaluate((element) => {
    const width = element.getBoundingClientRect().width;
    const other = /^([\d.]+|z-level|short|meeting target|required)$/;
    const names = [...element.querySelectorAll('text')].filter(
      (t) => !other.test(t.textContent?.trim() ?? '')
    );
    const right = Math.max(...names.map((t) => t.getBoundingClientRect().right));
    return { width, names: names.length, left: element.getBoundingClientRect().left, right };
  });
  expect(room.names).toBeGreaterThan(10);
  expect(room.right - room.left).toBeLessThan(room.width * 0.5);
  // The movement chart names its across quarter within the chart (at the axis's end it ran off a phone's edge).
  const movement = await drawnChart(
    page
      .locator('figure')
      .filter({ has: page.locator('figcaption', { hasText: /\(across\) against/ }) })
      .locator('[data-testid="chart"]')
  );
  const across = movement.locator('text').filter({ hasText: /^\d{4}-Q\d$/ });
  await expect(across).toHaveCount(2);
  const inside = await movement.evaluate((element) => {
    const box = element.getBoundingClientRect();
    return [...element.querySelectorAll('text')]
      .filter((t) => /^\d{4}-Q\d$/.test(t.textContent?.trim() ?? ''))
      .every((t) => t.getBoundingClientRect().right <= box.right + 0.5);
  });
  expect(inside).toBe(true);
  // The sites chart names every site down its side (across it, a phone showed the first and the last only).
  const siteNames = await page.getByTestId('sites-table').locator('tbody th[scope="row"]').allTextContents();
  expect(siteNames.length).toBeGreaterThan(2);
  const sitesSvg = await drawnChart(
    page
      .locator('figure')
      .filter({ has: page.locator('figcaption', { hasText: /^z-levels of each site's processes/ }) })
      .locator('[data-testid="chart"]')
  );
  await expect(sitesSvg.locator('text').filter({ hasText: /^z-level$/ })).toHaveCount(1);
  const written = await sitesSvg.locator('text').allTextContents();
  // Long names end in an ellipsis where the room runs out: their first ten characters are written.
  for (const name of siteNames)
    expect(written.some((t) => t.startsWith(name.trim().slice(0, 10)))).toBe(true);
});
