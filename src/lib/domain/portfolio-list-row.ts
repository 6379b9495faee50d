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
 * One ranked process as the portfolio's list shows it. The ranking's worker keeps the full rows (every
 * characteristic with its window figures) and sends the page these: a twentieth of the bytes to copy across
 * threads at company size, so receiving 2 000 of them is no long task. A row's details, and the CSV of the
 * list, are asked of the worker when wanted.
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

export function listRowOf(row: ProcessRow): PortfolioListRow {
  const { process, site, weakest } = row;
  const out: PortfolioListRow = {
    process: { id: process.id, name: process.name, contextId: process.contextId, currency: process.currency },
    site: { id: site.id, name: site.name },
    measure: row.profile?.measure,
    status: row.status,
    riskClass: row.riskClass,
    zBasis: row.zBasis,
    badges: row.badges,
    projects: row.projects.map((p) => ({ id: p.id, phase: p.phase }))
  };
  if (row.yield !== undefined) out.yield = row.yield;
  if (row.ppm !== undefined) out.ppm = row.ppm;
  if (row.zLevel !== undefined) out.zLevel = row.zLevel;
  if (row.requiredZ !== undefined) out.requiredZ = row.requiredZ;
  if (row.costPerYear !== undefined) out.costPerYear = row.costPerYear;
  if (row.trend.length > 0) out.trend = row.trend;
  if (row.trendSlope !== undefined) out.trendSlope = row.trendSlope;
  if (weakest) {
    const figure: PortfolioListRow['weakest'] = {
      name: weakest.characteristic.name,
      required: weakest.required
    };
    if (weakest.estimate !== undefined) figure.estimate = weakest.estimate;
    if (weakest.bound !== undefined) figure.bound = weakest.bound;
    if (weakest.requiredZ !== undefined) figure.requiredZ = weakest.requiredZ;
    if (weakest.result) {
      const { cpk, ppk } = weakest.result;
      figure.result = {};
      if (cpk !== undefined) figure.result.cpk = cpk;
      if (ppk !== undefined) figure.result.ppk = ppk;
    }
    out.weakest = figure;
  }
  return out;
}
