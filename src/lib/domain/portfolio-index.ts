import type { Characteristic } from './characteristic';
import { isOpen, type ImprovementProject } from './improvement-project';
import type { Site } from './site';
import type { PortfolioRecords } from './portfolio-terms';

/**
 * The structure of a portfolio arranged once for ranking: live characteristics per process in name order, sites
 * by id, open projects per process. (The studies are held month by month in the read model,
 * monthly-statistics.ts.) The review ranks up to ten quarters; grouping and sorting every call cost more than the
 * figures themselves at company size.
 *
 * Built once per record array and remembered by identity (a WeakMap, so it goes when the records go): a page
 * that reloads its records gets a new array and so a new index; re-judging the same records reuses it.
 */
export interface PortfolioIndex {
  /** Live, unarchived characteristics of each process, by name then id. */
  characteristics: Map<string, Characteristic[]>;
  sites: Map<string, Site>;
  /** Projects still open (not closed or cancelled) per process. */
  openProjects: Map<string, ImprovementProject[]>;
}

/**
 * A month `YYYY-MM` as one number (year × 12 + month − 1), read by character codes: months are validated when
 * they are stored, and a regular expression per study per call was a measurable share of a ranking.
 */
export function monthOrdinal(period: string): number {
  const year =
    (period.charCodeAt(0) - 48) * 1000 +
    (period.charCodeAt(1) - 48) * 100 +
    (period.charCodeAt(2) - 48) * 10 +
    (period.charCodeAt(3) - 48);
  const month = (period.charCodeAt(5) - 48) * 10 + (period.charCodeAt(6) - 48);
  return year * 12 + month - 1;
}

const structureIndexes = new WeakMap<
  readonly Characteristic[],
  { sites: readonly Site[]; projects: readonly ImprovementProject[]; index: PortfolioIndex }
>();

function indexStructure(records: PortfolioRecords): PortfolioIndex {
  const characteristics = new Map<string, Characteristic[]>();
  for (const c of records.characteristics) {
    // Archived characteristics keep their history but leave the ranking (and so the review).
    if (c.deletedAt || c.archivedAt) continue;
    const list = characteristics.get(c.processId);
    if (list) list.push(c);
    else characteristics.set(c.processId, [c]);
  }
  for (const list of characteristics.values())
    list.sort((a, b) => a.name.localeCompare(b.name) || a.id.localeCompare(b.id));
  const openProjects = new Map<string, ImprovementProject[]>();
  for (const p of records.projects) {
    // Closed and cancelled projects keep their record and history, but no longer count as work on the process.
    if (p.deletedAt || !isOpen(p)) continue;
    const list = openProjects.get(p.processId);
    if (list) list.push(p);
    else openProjects.set(p.processId, [p]);
  }
  return {
    characteristics,
    sites: new Map(records.sites.filter((s) => !s.deletedAt).map((s) => [s.id, s])),
    openProjects
  };
}

/** The index of a record set, built on first use and remembered while the same arrays are passed. */
export function portfolioIndex(records: PortfolioRecords): PortfolioIndex {
  let structure = structureIndexes.get(records.characteristics);
  if (!structure || structure.sites !== records.sites || structure.projects !== records.projects) {
    structure = { sites: records.sites, projects: records.projects, index: indexStructure(records) };
    structureIndexes.set(records.characteristics, structure);
  }
  return structure.index;
}
