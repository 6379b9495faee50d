import type { Characteristic } from './characteristic';
import { isOpen, type ImprovementProject } from './improvement-project';
import type { Site } from './site';
import type { Study } from './study';
import type { PortfolioRecords } from './portfolio-terms';

/**
 * The records of a portfolio arranged once for ranking: live studies per characteristic in month order with
 * their months as numbers, live characteristics per process in name order, sites by id, open projects per
 * process. A ranking asks for the months of a window many times (the review ranks up to ten quarters); grouping
 * and sorting every call cost more than the figures themselves at company size.
 *
 * Built once per record array and remembered by identity (a WeakMap, so it goes when the records go): a page
 * that reloads its records gets a new array and so a new index; re-judging the same records reuses it.
 */
export interface PortfolioIndex {
  /** Live studies of each characteristic, in month order, and their months as ordinals (see monthOrdinal). */
  studies: Map<string, { list: Study[]; months: Int32Array }>;
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

const studyIndexes = new WeakMap<readonly Study[], PortfolioIndex['studies']>();
const structureIndexes = new WeakMap<
  readonly Characteristic[],
  { sites: readonly Site[]; projects: readonly ImprovementProject[]; index: Omit<PortfolioIndex, 'studies'> }
>();

function indexStudies(studies: readonly Study[]): PortfolioIndex['studies'] {
  const grouped = new Map<string, Study[]>();
  for (const s of studies) {
    if (s.deletedAt) continue;
    const list = grouped.get(s.characteristicId);
    if (list) list.push(s);
    else grouped.set(s.characteristicId, [s]);
  }
  const out: PortfolioIndex['studies'] = new Map();
  for (const [id, list] of grouped) {
    list.sort((a, b) => (a.period < b.period ? -1 : a.period > b.period ? 1 : 0));
    const months = new Int32Array(list.length);
    for (let i = 0; i < list.length; i += 1) months[i] = monthOrdinal(list[i]!.period);
    out.set(id, { list, months });
  }
  return out;
}

function indexStructure(records: PortfolioRecords): Omit<PortfolioIndex, 'studies'> {
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
  let studies = studyIndexes.get(records.studies);
  if (!studies) {
    studies = indexStudies(records.studies);
    studyIndexes.set(records.studies, studies);
  }
  let structure = structureIndexes.get(records.characteristics);
  if (!structure || structure.sites !== records.sites || structure.projects !== records.projects) {
    structure = { sites: records.sites, projects: records.projects, index: indexStructure(records) };
    structureIndexes.set(records.characteristics, structure);
  }
  return { studies, ...structure.index };
}

/** First position in sorted `months` holding a month ≥ `month` (binary search). */
export function firstAtOrAfter(months: Int32Array, month: number): number {
  let lo = 0;
  let hi = months.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (months[mid]! < month) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
