import type { BrowserContext, Page } from '@playwright/test';

/**
 * The page's own clock for the browser rows: when a thing first appeared in the document, and when the person's
 * action that led to it happened, both read from `performance.now()` in the page. Playwright's waiting finds an
 * element by polling, at growing intervals up to half a second: timed from the test's side, a preview the page
 * showed after 2.96 s was found after 3.43 s (2026-12-04, a MutationObserver beside the wait). The test still
 * waits with Playwright; the figure is the page's.
 */

/** Things a row waits for, each as the page finds it (a CSS selector). */
export const SIGHTS = {
  'import-preview': '[data-testid="import-preview"]',
  'exchange-done': '[data-testid="exchange-done"]',
  'portfolio-row': '[data-testid="portfolio-table"] tbody tr',
  headline: '[data-testid="headline"]',
  /** The process page's first month's figures (computed in a worker, shown after the name). */
  'process-figures': 'td[data-label="Yield"]'
} as const;
export type Sight = keyof typeof SIGHTS;

/**
 * Plain JavaScript run in every document before the app's own (a string: a function from this file would be
 * rewritten by the TypeScript loader with helpers the page does not have).
 */
const INIT = `(() => {
  const sights = ${JSON.stringify(SIGHTS)};
  const clock = { seen: {}, old: {}, events: {} };
  window.capstanClock = clock;
  const find = (key) => document.querySelector(sights[key]);
  clock.find = find;
  new MutationObserver(() => {
    for (const key of Object.keys(sights)) {
      if (clock.seen[key] !== undefined) continue;
      const el = find(key);
      if (el && el !== clock.old[key]) clock.seen[key] = performance.now();
    }
  }).observe(document, { subtree: true, childList: true, characterData: true });
  for (const type of ['change', 'click'])
    document.addEventListener(type, (e) => {
      const el = e.target && e.target.closest ? e.target.closest('[data-testid]') : null;
      if (el) clock.events[type + ':' + el.getAttribute('data-testid')] = performance.now();
    }, true);
})();`;

/** Installs the clock in every document the context opens from now on. */
export async function installPageClock(context: BrowserContext): Promise<void> {
  await context.addInitScript({ content: INIT });
}

interface ClockState {
  seen: Record<string, number | undefined>;
  old: Record<string, Element | null>;
  events: Record<string, number | undefined>;
  find: (key: string) => Element | null;
}

/** Forgets what was seen so far in this document: an element shown now counts again only once replaced. */
export async function restartPageClock(page: Page): Promise<void> {
  await page.evaluate((keys) => {
    const clock = (window as unknown as { capstanClock: ClockState }).capstanClock;
    clock.seen = {};
    for (const key of keys) clock.old[key] = clock.find(key);
  }, Object.keys(SIGHTS));
}

/**
 * Milliseconds from the start of the document's navigation — or from the last `from.event` on the element with
 * test id `from.testId` — to the first sight of `sight`. Call once the test has waited for it.
 */
export async function pageClockMs(
  page: Page,
  sight: Sight,
  from?: { event: 'change' | 'click'; testId: string }
): Promise<number> {
  const { seen, start } = await page.evaluate(
    ([key, event]) => {
      const clock = (window as unknown as { capstanClock: ClockState }).capstanClock;
      return { seen: clock.seen[key], start: event === '' ? 0 : clock.events[event] };
    },
    [sight, from ? `${from.event}:${from.testId}` : ''] as const
  );
  if (seen === undefined || start === undefined)
    throw new Error(
      `the page's clock did not see ${seen === undefined ? sight : `${from!.event} on ${from!.testId}`}`
    );
  return seen - start;
}
