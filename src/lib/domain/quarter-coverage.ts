import { PROJECT_PHASES, type ImprovementProject, type ProjectPhase } from './improvement-project';
import { monthOrdinal } from './portfolio-index';
import type { PortfolioRecords } from './portfolio-terms';
import { periodsOfQuarter, quarterOf } from './period';
import { CELL, periodOfOrdinal, type MonthlyStatistics } from './monthly-statistics';
import { isLive } from './record-meta';

/** How completely one site reported in a quarter. */
export interface SiteQuarterCoverage {
  siteId: string;
  siteName: string;
  processes: number;
  characteristics: number;
  /** Months logged per month of the quarter (characteristics with a live study that month), in month order. */
  loggedByMonth: number[];
  /** Characteristics × months: what full reporting would be. */
  expected: number;
}

export interface QuarterCoverage {
  quarter: string;
  periods: string[];
  sites: SiteQuarterCoverage[];
  projectsByPhase: { phase: ProjectPhase; projects: ImprovementProject[] }[];
  /** Every quarter with at least one live study, newest first. */
  quartersWithData: string[];
}

/**
 * Who reported in a quarter, from the read model (one pass over the characteristics and the quarter's three
 * columns; the quarters with data from one pass over the columns): computed in the review's worker beside the
 * figures, so the page's thread never reads the quarter's studies.
 */
export function quarterCoverage(
  records: Omit<PortfolioRecords, 'studies'>,
  model: MonthlyStatistics,
  quarter: string
): QuarterCoverage {
  const periods = periodsOfQuarter(quarter);
  const months = periods.map(monthOrdinal);
  const liveProcesses = records.processes.filter(isLive);
  const siteOfProcess = new Map(liveProcesses.map((p) => [p.id, p.siteId]));
  const charsOfSite = new Map<string, number>();
  const loggedOfSite = new Map<string, number[]>();
  for (const c of records.characteristics) {
    if (!isLive(c)) continue;
    const siteId = siteOfProcess.get(c.processId);
    if (siteId === undefined) continue;
    charsOfSite.set(siteId, (charsOfSite.get(siteId) ?? 0) + 1);
    const row = model.rowOf(c.id);
    if (row === undefined) continue;
    months.forEach((m, i) => {
      const cell = model.cellOf(row, m);
      if (cell < 0 || model.kind[cell] === CELL.empty) return;
      let counts = loggedOfSite.get(siteId);
      if (!counts) loggedOfSite.set(siteId, (counts = periods.map(() => 0)));
      counts[i]! += 1;
    });
  }
  const processesOfSite = new Map<string, number>();
  for (const p of liveProcesses) processesOfSite.set(p.siteId, (processesOfSite.get(p.siteId) ?? 0) + 1);
  const sites: SiteQuarterCoverage[] = records.sites
    .filter(isLive)
    .map((site) => {
      const characteristics = charsOfSite.get(site.id) ?? 0;
      return {
        siteId: site.id,
        siteName: site.name,
        processes: processesOfSite.get(site.id) ?? 0,
        characteristics,
        loggedByMonth: loggedOfSite.get(site.id) ?? periods.map(() => 0),
        expected: characteristics * periods.length
      };
    })
    .sort((a, b) => a.siteName.localeCompare(b.siteName));
  const liveProjects = records.projects.filter((p) => isLive(p) && siteOfProcess.has(p.processId));
  return {
    quarter,
    periods,
    sites,
    projectsByPhase: PROJECT_PHASES.map((phase) => ({
      phase,
      projects: liveProjects.filter((p) => p.phase === phase)
    })),
    quartersWithData: quartersWithData(model)
  };
}

/** Quarters in which any month holds a live study, newest first. */
function quartersWithData(model: MonthlyStatistics): string[] {
  const quarters = new Set<string>();
  const rows = model.kind.length / Math.max(1, model.span);
  for (let col = 0; col < model.span; col += 1) {
    let any = false;
    for (let row = 0; row < rows && !any; row += 1) any = model.kind[row * model.span + col] !== CELL.empty;
    if (!any) continue;
    quarters.add(quarterOf(periodOfOrdinal(model.firstMonth + col)));
  }
  return [...quarters].sort().reverse();
}
