import type { CharacteristicStatus } from './portfolio-terms';

/** What the person filters the ranked portfolio by; empty means "all". */
export interface PortfolioFilters {
  site: string;
  context: string;
  risk: string;
  status: string;
  project: '' | 'with' | 'without';
}

export const NO_FILTERS: PortfolioFilters = { site: '', context: '', risk: '', status: '', project: '' };

/** What filtering reads of a row: the page's list rows and the worker's full rows both have it. */
interface FilteredRow {
  site: { id: string };
  process: { contextId: string };
  riskClass: string;
  status: CharacteristicStatus;
  projects: readonly unknown[];
}

/** The rows the filters let through, in their order: one rule for the list on screen and its CSV. */
export function filterRows<Row extends FilteredRow>(rows: readonly Row[], f: PortfolioFilters): Row[] {
  return rows.filter(
    (row) =>
      (!f.site || row.site.id === f.site) &&
      (!f.context || row.process.contextId === f.context) &&
      (!f.risk || row.riskClass === f.risk) &&
      (!f.status || row.status === f.status) &&
      (!f.project || (f.project === 'with') === row.projects.length > 0)
  );
}
