/** What the person filters the ranked portfolio by; empty means "all". */
export interface PortfolioFilters {
  site: string;
  context: string;
  risk: string;
  status: string;
  project: '' | 'with' | 'without';
}

export const NO_FILTERS: PortfolioFilters = { site: '', context: '', risk: '', status: '', project: '' };
