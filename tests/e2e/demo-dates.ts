import { datedFromToday, type DemoPortfolio } from '../../src/lib/domain/demo-portfolio';
import { parseDemoPortfolio } from '../../src/lib/domain/demo-portfolio-schema';
import { addMonths, lastCompletePeriod, periodOf, quarterOf } from '../../src/lib/domain/period';
import { readFileSync } from 'node:fs';

/**
 * Months for browser tests that hold whatever the day they run: the app dates the demo from the day it is
 * loaded (its last month is the last complete one) and refuses months that have not begun.
 */

/** A month long past, with no demo data: every characteristic starts "not yet logged". */
export const QUIET_MONTH = addMonths(periodOf(new Date()), -30);

/** The demo as the app holds it once loaded today. */
export function demoAsLoaded(): DemoPortfolio {
  const file: unknown = JSON.parse(
    readFileSync(new URL('../../seed-data/demo-portfolio.json', import.meta.url), 'utf8')
  );
  return datedFromToday(parseDemoPortfolio(file), Date.now());
}

/** The last whole quarter with demo data in every month. */
export const DEMO_QUARTER = quarterOf(addMonths(lastCompletePeriod(), -3));
