import type { RiskClass } from './characteristic';
import type { RulingMeasure } from './context-profile';
import type { ImprovementProject } from './improvement-project';
import type { Badge, CharacteristicStatus, ProcessRow } from './portfolio-terms';
import type { Process } from './process';
import type { Site } from './site';

/** What a ruling figure's words need: "Cpk 1.12 (bound 0.98) vs ≥ 1.33". */
export interface RulingFigure {
  estimate?: number;
  bound?: number;
  required: number;
  /** The required level as a z-level (counted data are judged on it where the measure is an index). */
  requiredZ?: number;
  /** Which index the estimate is, where the measure is an index. */
  result?: { cpk?: number; ppk?: number };
}

/**
 * One ranked process as the portfolio's list draws it, built from the list's columns (portfolio-list-columns.ts)
 * for the rows on screen. A row's details (the full row), and the CSV of the list, are asked of the worker.
 */
export interface PortfolioListRow {
  process: Pick<Process, 'id' | 'name' | 'contextId' | 'currency'>;
  site: Pick<Site, 'id' | 'name'>;
  measure: RulingMeasure | undefined;
  status: CharacteristicStatus;
  riskClass: RiskClass;
  yield?: number;
  ppm?: number;
  zLevel?: number;
  zBasis: ProcessRow['zBasis'];
  weakest?: RulingFigure & { name: string };
  requiredZ?: number;
  costPerYear?: number;
  /** Absent where the ranking computed no trend lines: the page asks for those of the rows it shows. */
  trend?: (number | undefined)[];
  trendSlope?: number;
  badges: Badge[];
  projects: Pick<ImprovementProject, 'id' | 'phase'>[];
}
