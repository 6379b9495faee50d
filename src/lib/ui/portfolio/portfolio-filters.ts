import type { ProcessRow } from '../../domain/portfolio-terms';

/** What the person filters the ranked portfolio by; empty means "all". */
export interface PortfolioFilters {
  site: string;
  context: string;
  risk: string;
  status: string;
  project: '' | 'with' | 'without';
}

export const NO_FILTERS: PortfolioFilters = { site: '', context: '', risk: '', status: '', project: '' };

export function filterRows(rows: readonly ProcessRow[], f: PortfolioFilters): ProcessRow[] {
  return rows.filter(
    (row) =>
      (!f.site || row.site.id === f.site) &&
      (!f.context || row.process.contextId === f.context) &&
      (!f.risk || row.riskClass === f.risk) &&
      (!f.status || row.status === f.status) &&
      (!f.project || (f.project === 'with') === row.projects.length > 0)
  );
}

export const statusClass = (s: string) => (s === 'short' ? 'warn' : s === 'meets, shown' ? 'good' : '');
