import { expect, type Locator, type Page } from '@playwright/test';

/**
 * Brings each chart of the page into view in turn, as a reader scrolling down does, and waits until it shows the
 * current figures: a chart is drawn only in or near the view (src/lib/ui/near-view.ts). Returns how many.
 */
export async function drawEveryChart(page: Page, timeout?: number): Promise<number> {
  const charts = page.getByTestId('chart');
  const count = await charts.count();
  for (let i = 0; i < count; i++) {
    const chart = charts.nth(i);
    await chart.scrollIntoViewIfNeeded();
    await expect(chart.locator('svg')).toHaveCount(1, { timeout });
    await expect(chart).toHaveAttribute('aria-busy', 'false', { timeout });
  }
  return count;
}

/** Brings one chart into view and waits for its drawing; returns the drawing (its SVG). */
export async function drawnChart(chart: Locator): Promise<Locator> {
  await chart.scrollIntoViewIfNeeded();
  const svg = chart.locator('svg');
  await expect(svg).toBeVisible();
  return svg;
}
