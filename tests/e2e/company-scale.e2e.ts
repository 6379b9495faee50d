import { expect, test, type Page } from '@playwright/test';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { companyPortfolioFile } from '../bench/company-portfolio-file';
import { drawEveryChart } from './charts-in-view';
import { startStaticServer, type RunningServer } from './static-server';

/**
 * A company of 2 000 processes × 36 months (72 000 studies, 50 sites) received from an exchange file, then the
 * portfolio and the quarterly review opened. The ranking and the review run in workers, so the page's own thread
 * stays free: the browser's long-task entries (tasks over 50 ms) are counted and printed, and none may reach a
 * second — a bound far above what the page does now (a few hundred ms, see `npm run bench`) and far below what
 * it did when the review was computed on the page (5–6 s), so it fails only when heavy work comes back to the
 * page's thread. Receiving the file is held to half a second: it is read, compared and merged in its worker.
 * Timings themselves are the benchmark's business.
 */
const PROCESSES = 2000;
const LONGEST_ALLOWED_MS = 1000;
const RECEIVING_ALLOWED_MS = 500;

let server: RunningServer;
let work: string;
let file: string;
test.beforeAll(async () => {
  server = await startStaticServer();
  work = mkdtempSync(join(tmpdir(), 'capstan-company-'));
  file = join(work, 'company.capstan.json');
  writeFileSync(file, await companyPortfolioFile(PROCESSES));
});
test.afterAll(async () => {
  await server.stop();
  rmSync(work, { recursive: true, force: true });
});

/** Long tasks from now on; with `sinceLoad`, those of the page's loading too. */
async function watchLongTasks(page: Page, sinceLoad = true): Promise<() => Promise<number[]>> {
  await page.evaluate((buffered) => {
    const w = window as unknown as { longTasks: number[] };
    w.longTasks = [];
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) w.longTasks.push(e.duration);
    }).observe({ type: 'longtask', buffered });
  }, sinceLoad);
  return () => page.evaluate(() => (window as unknown as { longTasks: number[] }).longTasks);
}

test('2 000 processes: received, ranked and reviewed without a long task on the page', async ({ page }) => {
  test.setTimeout(240_000);
  await page.goto(new URL('/exchange', server.url).href);
  await page.getByTestId('exchange-file-input').waitFor();
  let longTasks = await watchLongTasks(page, false);
  await page.getByTestId('exchange-file-input').setInputFiles(file);
  await expect(page.getByTestId('import-preview')).toBeVisible({ timeout: 120_000 });
  // Seconds of writing: the status line says how far it has got. Every text the page's status lines take is kept
  // as it comes: on a fast machine the merge ends within a second or two, and its progress line can come and go
  // between two looks of a poll.
  await page.evaluate(() => {
    const w = window as unknown as { statusTexts: string[] };
    w.statusTexts = [];
    new MutationObserver(() => {
      for (const e of document.querySelectorAll('[role=status]')) w.statusTexts.push(e.textContent ?? '');
    }).observe(document.body, { subtree: true, childList: true, characterData: true });
  });
  await page.getByTestId('confirm-merge').click();
  await expect(page.getByTestId('exchange-done')).toContainText('Merged', { timeout: 120_000 });
  const statusTexts = await page.evaluate(() => (window as unknown as { statusTexts: string[] }).statusTexts);
  expect(statusTexts.filter((t) => /of \S+ records written/.test(t)).length).toBeGreaterThan(0);
  const receiving = await longTasks();
  console.log(
    `receiving the file, ${PROCESSES} processes: ${receiving.length} long tasks, longest ${Math.round(Math.max(0, ...receiving))} ms`
  );
  // Read, compared and merged in the worker: no task of the page's over 50 ms here, where planning the whole file
  // on the page in one task took 0.9 s. Half a second fails only if whole-file work comes back to the page.
  expect(Math.max(0, ...receiving)).toBeLessThan(RECEIVING_ALLOWED_MS);

  await page.goto(server.url);
  longTasks = await watchLongTasks(page);
  await expect(page.getByTestId('portfolio-summary')).toContainText(
    `${PROCESSES.toLocaleString('en-US')} processes at 50 sites`,
    {
      timeout: 60_000
    }
  );
  const portfolio = await longTasks();
  console.log(
    `portfolio, ${PROCESSES} processes: ${portfolio.length} long tasks, longest ${Math.round(Math.max(0, ...portfolio))} ms`
  );
  expect(Math.max(0, ...portfolio)).toBeLessThan(LONGEST_ALLOWED_MS);

  // The list arrives without trend lines: those of the rows in view are asked of the worker and drawn, at the
  // top and again after scrolling to the end.
  const drawnRows = page.getByTestId('portfolio-table').locator('tbody tr[data-row]');
  // The rows in view come a few per task (busy meanwhile), then the margin around them: more than the first six.
  await expect(page.getByTestId('portfolio-table')).toHaveAttribute('aria-busy', 'false');
  expect(await drawnRows.count()).toBeGreaterThan(6);
  const direction = /^(improving|declining|steady|no trend yet)$/;
  await expect(drawnRows.first().locator('.trend .dir')).toHaveText(direction);
  // Scrolled to the end as a person does (again, once the rows' height is known), the last row is drawn and
  // stays: rows of different heights once made the view near the end jump back and forth without end.
  const list = page.locator('.table-scroll.list');
  const lastRank = () => drawnRows.last().locator('td').first().textContent();
  await expect
    .poll(async () => {
      await list.evaluate((e) => (e.scrollTop = e.scrollHeight));
      return lastRank();
    })
    .toBe(String(PROCESSES));
  await page.waitForTimeout(1000);
  expect(await lastRank()).toBe(String(PROCESSES));
  await expect(drawnRows.last().locator('.trend .dir')).toHaveText(direction);

  // The process list shows the first hundred and finds any other by a part of its name, with its latest month.
  await page.goto(new URL('/process', server.url).href);
  await expect(
    page.getByRole('status').filter({ hasText: 'Showing the first 100 of 2,000 processes' })
  ).toBeVisible();
  await expect(page.locator('main li')).toHaveCount(100);
  await page.getByLabel('Find a process').fill('Line 1999');
  await expect(page.locator('main li')).toHaveCount(1);
  await expect(page.locator('main li')).toContainText(
    /Line 1999 · .+ · 1 characteristic · latest \d{4}-\d{2}$/
  );

  await page.goto(new URL('/review', server.url).href);
  longTasks = await watchLongTasks(page);
  await expect(page.getByTestId('headline-reviewed')).toHaveText(/\d+/, { timeout: 60_000 });
  // The headline counts the same processes the portfolio lists.
  await expect(page.getByTestId('headline')).toContainText(
    `of ${PROCESSES.toLocaleString('en-US')} processes reviewed`
  );
  const review = await longTasks();
  console.log(
    `review, ${PROCESSES} processes: ${review.length} long tasks, longest ${Math.round(Math.max(0, ...review))} ms`
  );
  expect(Math.max(0, ...review)).toBeLessThan(LONGEST_ALLOWED_MS);

  // Every chart is drawn, those of every process too (their points handed over in one typed array each), and a
  // point of the movement chart still names its process when pointed at, though the points carry no names.
  // The sections come one per task, so the number of charts is read again at each look: read once, it was
  // taken while a section was still to come (five charts counted, six drawn).
  // Each chart is drawn as it comes near the view (src/lib/ui/near-view.ts): brought into view one by one.
  await expect(page.getByRole('status').filter({ hasText: 'Drawing this section' })).toHaveCount(0, {
    timeout: 30_000
  });
  expect(await drawEveryChart(page)).toBeGreaterThan(0);
  await expect(page.getByTestId('chart').filter({ hasNot: page.locator('svg') })).toHaveCount(0);
  const movement = page.locator('figure', { hasText: 'above the diagonal improved' }).getByTestId('chart');
  const svg = movement.locator('svg');
  await movement.scrollIntoViewIfNeeded();
  // The first point of the one path that draws them all (circles of radius 5, each written from a point of its
  // outline): pointed at around there.
  const start = await svg.evaluate((element) => {
    const d = [...element.querySelectorAll('path')]
      .map((p) => p.getAttribute('d') ?? '')
      .reduce((a, b) => (b.length > a.length ? b : a));
    const [, x, y] = /^M\s*(-?[\d.]+)[\s,]+(-?[\d.]+)/.exec(d) ?? [];
    return { x: Number(x), y: Number(y) };
  });
  const box = (await svg.boundingBox())!;
  const texts = () => svg.locator('text').allTextContents();
  await expect
    .poll(async () => {
      for (const [dx, dy] of [
        [0, 0],
        [0, 5],
        [-5, 0],
        [5, 0],
        [0, -5]
      ] as const) {
        await page.mouse.move(box.x + start.x + dx, box.y + start.y + dy);
        const named = (await texts()).find((t) => / · Works /.test(t));
        if (named) return named;
      }
      return '';
    })
    .toMatch(/^.+ · Works .+$/);
});

test('a company’s file received again, then revised, merges where this device already holds its records', async ({
  page
}) => {
  // 50 processes: 1 800 studies, more than one part (1 000 keys) of the reads that compare a file with this
  // device. Those reads, awaited a part at a time inside the comparison's transaction, once went on outside it in
  // Chromium (fake-indexeddb in the unit tests did not show it), and a file already held here was refused with
  // "Transaction committed too early" — folder sync reads each device's whole file again every time.
  test.setTimeout(120_000);
  const again = join(work, 'again.capstan.json');
  const revised = join(work, 'revised.capstan.json');
  writeFileSync(again, await companyPortfolioFile(50));
  writeFileSync(revised, await companyPortfolioFile(50, 36, { revised: true }));
  await page.goto(new URL('/exchange', server.url).href);
  await page.getByTestId('exchange-file-input').waitFor();
  const receive = async (path: string, counts: RegExp) => {
    await page.getByTestId('exchange-file-input').setInputFiles(path);
    await expect(page.getByTestId('import-preview')).toBeVisible({ timeout: 60_000 });
    await expect(page.getByTestId('exchange-error')).toHaveCount(0);
    await expect(page.getByTestId('import-preview').getByRole('row', { name: /^study / })).toHaveText(counts);
    await page.getByTestId('confirm-merge').click();
    await expect(page.getByTestId('exchange-done')).toContainText('Merged', { timeout: 60_000 });
  };
  // Columns: new, updated, deleted, unchanged, conflicts.
  await receive(again, /^study\s*1800\s*0\s*0\s*0\s*0$/);
  await receive(again, /^study\s*0\s*0\s*0\s*1800\s*0$/);
  await receive(revised, /^study\s*0\s*1800\s*0\s*0\s*0$/);
  await expect(page.getByTestId('exchange-done')).toContainText('1800 updated');
});
