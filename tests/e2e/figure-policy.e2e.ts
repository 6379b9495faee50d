import { DEMO_QUARTER } from './demo-dates';
import { expect, test, type Page } from '@playwright/test';
import { startStaticServer, type RunningServer } from './static-server';
import { drawEveryChart } from './charts-in-view';

/**
 * Every main page with the demo loaded, at a laptop's 1366 px and a phone's 390 px, read as a practitioner reads
 * it: no figure in scientific notation, no percentage with more decimals than the figure policy allows
 * (domain/figure-format.ts: at most 5, never "100.00000 %" or "0.00000 %"), no count with its noun in the wrong
 * number or a "(s)" placeholder, and no page wider than the screen (tables scroll inside their own box or
 * become cards). A screenshot of each page is kept in tests/e2e/.output/pages/ to be looked at.
 */

let server: RunningServer;
test.beforeEach(async () => {
  server = await startStaticServer();
});
test.afterEach(async () => server.stop());

/**
 * A number in exponent form standing alone ("1.6e-3", "3.05e+4"); not part of a word or an id — a device id
 * shown on a page once began "10780e86-5a6e-…", which read as 10780·10⁸⁶ when only letters and digits ended a match.
 */
const SCIENTIFIC = /(?<![\w.-])\d+(?:[.,]\d+)?[eE][+-]?\d+(?![\w-])/;
const PERCENT = /(\d+)[.,](\d+)\s?%/g;
const FALSE_PRECISION = /(?<![\d.,])(100|0)[.,]0{3,}\s?%/;
const NOUNS =
  'studies|sites|processes|months|values|records|characteristics|rows|conflicts|changes|days|projects|units|defects|rates|subgroups|quarters|warnings';
const ONE_PLURAL = new RegExp(`(?<![\\d.,])1 (${NOUNS})\\b`);
const PLACEHOLDER = /\w\((s|es)\)/;

/** What a reader would find wrong on the page now: each problem with the text around it. */
async function problemsOn(page: Page, name: string): Promise<string[]> {
  const { text, overflow, pastBox } = await page.evaluate(() => ({
    text: document.body.innerText,
    overflow: document.documentElement.scrollWidth - document.documentElement.clientWidth,
    // Elements that run past the right edge of the box they sit in (where that box does not scroll): a select
    // once ran into the next field of a form, a file picker out of its drop box, a table past its panel.
    pastBox: [...document.body.querySelectorAll('*')].flatMap((el) => {
      const parent = el.parentElement;
      if (!(el instanceof HTMLElement) || !parent) return [];
      const own = getComputedStyle(el);
      const around = getComputedStyle(parent);
      if (around.display === 'contents' || around.overflowX !== 'visible') return [];
      if (own.position === 'absolute' || own.position === 'fixed') return [];
      const box = el.getBoundingClientRect();
      const outer = parent.getBoundingClientRect();
      if (box.width === 0 || outer.width === 0 || box.right <= outer.right + 1) return [];
      return [
        `${el.tagName.toLowerCase()} "${(el.textContent ?? '').trim().slice(0, 40)}" runs ${Math.round(box.right - outer.right)} px past its ${parent.tagName.toLowerCase()}`
      ];
    })
  }));
  const around = (i: number) => JSON.stringify(text.slice(Math.max(0, i - 30), i + 30));
  const problems: string[] = [];
  const sci = SCIENTIFIC.exec(text);
  if (sci) problems.push(`${name}: scientific notation ${around(sci.index)}`);
  for (const m of text.matchAll(PERCENT))
    if (m[2]!.length > 5)
      problems.push(`${name}: percentage with ${m[2]!.length} decimals ${around(m.index)}`);
  const precise = FALSE_PRECISION.exec(text);
  if (precise) problems.push(`${name}: false precision ${around(precise.index)}`);
  const plural = ONE_PLURAL.exec(text);
  if (plural) problems.push(`${name}: "${plural[0]}" ${around(plural.index)}`);
  const placeholder = PLACEHOLDER.exec(text);
  if (placeholder) problems.push(`${name}: placeholder plural ${around(placeholder.index)}`);
  if (overflow > 0) problems.push(`${name}: the page is ${overflow} px wider than the screen`);
  for (const past of pastBox) problems.push(`${name}: ${past}`);
  return problems;
}

for (const [label, width, height] of [
  ['1366 px', 1366, 900],
  ['390 px', 390, 844]
] as const) {
  test(`at ${label}, every main page writes its figures by the policy and fits the screen`, async ({
    page
  }) => {
    test.setTimeout(180_000);
    await page.setViewportSize({ width, height });
    const nav = async (name: string) => {
      // On a phone the main menu may sit behind its button.
      const link = page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name });
      if (!(await link.isVisible())) await page.getByRole('button', { name: /menu/i }).click();
      await link.click();
    };
    await page.goto(server.url);
    await page.getByTestId('load-demo').click();
    await expect(page.getByTestId('portfolio-table')).toBeVisible();
    const pages: [string, () => Promise<void>][] = [
      ['portfolio', async () => undefined],
      [
        'portfolio, a row open',
        async () => {
          await page
            .getByTestId('portfolio-table')
            .getByRole('button', { name: /details/i })
            .first()
            .click();
          await expect(page.getByTestId('row-detail')).toBeVisible();
        }
      ],
      [
        'process page',
        async () => {
          await page.getByTestId('portfolio-table').locator('tbody tr').first().locator('a').first().click();
          await drawEveryChart(page);
          // Every month's figures in (they are computed in the background): the checks read them all.
          await expect(page.getByTestId('figures-pending')).toHaveCount(0);
        }
      ],
      [
        'process page with models compared',
        async () => {
          // A process whose surface roughness is not normal: the page lists the models compared, a wide table.
          await nav('Portfolio');
          await page
            .getByTestId('portfolio-table')
            .locator('tbody tr a', { hasText: 'Camshaft journal grinding — line A' })
            .first()
            .click();
          await expect(page.getByRole('region', { name: /^Models compared for/ }).first()).toBeVisible();
          await expect(page.getByTestId('figures-pending')).toHaveCount(0);
        }
      ],
      ['process list', async () => nav('Process')],
      [
        'monthly log',
        async () => {
          await nav('Monthly log');
          await expect(page.getByTestId('open-count')).toBeVisible();
        }
      ],
      [
        'quarterly review',
        async () => {
          await nav('Quarterly review');
          await page.getByTestId('quarter').selectOption(DEMO_QUARTER);
          await drawEveryChart(page);
        }
      ],
      ['set-up', async () => nav('Set-up')],
      ['file exchange', async () => nav('File exchange')],
      ['settings', async () => nav('Settings')]
    ];
    const found: string[] = [];
    for (const [name, open] of pages) {
      await open();
      await page.waitForTimeout(400);
      found.push(...(await problemsOn(page, name)));
      await page.screenshot({
        path: `tests/e2e/.output/pages/${width}-${name.replace(/[^\w]+/g, '-')}.png`,
        fullPage: true
      });
    }
    expect(found).toEqual([]);
  });
}

test('the checks can fail: each finds what it is for', async ({ page }) => {
  await page.goto(server.url);
  await page.evaluate(() => {
    const p = document.createElement('p');
    p.textContent = 'ppm 1.6e-3 · yield 100.00000 % · 99.9999912 % · 1 studies · 3 site(s)';
    p.style.width = '5000px';
    p.style.display = 'block';
    document.body.append(p);
    const label = document.createElement('label');
    label.style.width = '100px';
    label.style.display = 'block';
    const select = document.createElement('select');
    select.style.width = '160px';
    label.append(select);
    document.body.append(label);
  });
  const found = (await problemsOn(page, 'planted')).join('\n');
  expect(found).toContain('scientific notation');
  expect(found).toContain('false precision');
  expect(found).toContain('percentage with 7 decimals');
  expect(found).toContain('"1 studies"');
  expect(found).toContain('placeholder plural');
  expect(found).toContain('wider than the screen');
  expect(found).toContain('select "" runs 60 px past its label');
});
