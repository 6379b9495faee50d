import { PROJECT_PHASES, type ImprovementProject, type ProjectPhase } from '../domain/improvement-project';
import { periodsOfQuarter } from '../domain/period';
import { isLive } from '../domain/record-meta';
import type { CapstanDatabase } from './database';

/** How completely one site reported in a quarter. */
export interface SiteQuarterCoverage {
  siteId: string;
  siteName: string;
  processes: number;
  characteristics: number;
  /** Studies logged per month of the quarter, in month order. */
  loggedByMonth: number[];
  /** Characteristics × months: what full reporting would be. */
  expected: number;
}

export interface QuarterCoverage {
  quarter: string;
  periods: string[];
  sites: SiteQuarterCoverage[];
  projectsByPhase: { phase: ProjectPhase; projects: ImprovementProject[] }[];
  /** Every quarter with at least one study, newest first. */
  quartersWithData: string[];
}

export async function loadQuarterCoverage(db: CapstanDatabase, quarter: string): Promise<QuarterCoverage> {
  const periods = periodsOfQuarter(quarter);
  const [sites, processes, characteristics, projects] = await Promise.all([
    db.sites.toArray(),
    db.processes.toArray(),
    db.characteristics.toArray(),
    db.projects.toArray()
  ]);
  const periodKeys = (await db.studies.orderBy('period').uniqueKeys()) as string[];
  const quartersWithData = [
    ...new Set(periodKeys.map((p) => `${p.slice(0, 4)}-Q${Math.floor((Number(p.slice(5, 7)) - 1) / 3) + 1}`))
  ]
    .sort()
    .reverse();
  const studies = (await db.studies.where('period').anyOf(periods).toArray()).filter(isLive);
  const liveProcesses = processes.filter(isLive);
  const liveCharacteristics = characteristics.filter(isLive);
  const siteOfProcess = new Map(liveProcesses.map((p) => [p.id, p.siteId]));
  const siteOfCharacteristic = new Map(
    liveCharacteristics.map((c) => [c.id, siteOfProcess.get(c.processId)])
  );

  const rows: SiteQuarterCoverage[] = sites
    .filter(isLive)
    .map((site) => {
      const chars = liveCharacteristics.filter((c) => siteOfCharacteristic.get(c.id) === site.id);
      const loggedByMonth = periods.map(
        (period) =>
          studies.filter(
            (s) => s.period === period && siteOfCharacteristic.get(s.characteristicId) === site.id
          ).length
      );
      return {
        siteId: site.id,
        siteName: site.name,
        processes: liveProcesses.filter((p) => p.siteId === site.id).length,
        characteristics: chars.length,
        loggedByMonth,
        expected: chars.length * periods.length
      };
    })
    .sort((a, b) => a.siteName.localeCompare(b.siteName));

  const liveProjects = projects.filter((p) => isLive(p) && siteOfProcess.has(p.processId));
  return {
    quarter,
    periods,
    sites: rows,
    projectsByPhase: PROJECT_PHASES.map((phase) => ({
      phase,
      projects: liveProjects.filter((p) => p.phase === phase)
    })),
    quartersWithData
  };
}
