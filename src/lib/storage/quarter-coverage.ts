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

  // One pass over characteristics, processes and studies each (not one per site and month): the review runs
  // this at every change, and at company size sites × months × studies was seconds.
  const charsOfSite = new Map<string, number>();
  for (const c of liveCharacteristics) {
    const siteId = siteOfCharacteristic.get(c.id);
    if (siteId !== undefined) charsOfSite.set(siteId, (charsOfSite.get(siteId) ?? 0) + 1);
  }
  const processesOfSite = new Map<string, number>();
  for (const p of liveProcesses) processesOfSite.set(p.siteId, (processesOfSite.get(p.siteId) ?? 0) + 1);
  const loggedOfSite = new Map<string, number[]>();
  for (const s of studies) {
    const siteId = siteOfCharacteristic.get(s.characteristicId);
    const month = periods.indexOf(s.period);
    if (siteId === undefined || month < 0) continue;
    let counts = loggedOfSite.get(siteId);
    if (!counts) loggedOfSite.set(siteId, (counts = periods.map(() => 0)));
    counts[month]! += 1;
  }
  const rows: SiteQuarterCoverage[] = sites
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
