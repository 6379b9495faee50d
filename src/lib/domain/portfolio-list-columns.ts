import { RISK_CLASSES } from './characteristic';
import type { RulingMeasure } from './context-profile';
import type { ImprovementProject } from './improvement-project';
import type { PortfolioFilters } from './portfolio-filters';
import type { PortfolioListRow } from './portfolio-list-row';
import { STATUS_ORDER, type Badge } from './portfolio-terms';

/** The ruling measures as the columns number them (risk classes by their RISK_CLASSES position). */
export const LIST_MEASURES: readonly RulingMeasure[] = ['index', 'zLevel', 'ppm'];

/**
 * The ranked list as the ranking's worker sends it to the page: one entry per process in ranked order, held by
 * column — numbers in typed arrays (NaN where a figure is not known), repeated strings as positions in small
 * tables (sites, contexts, currencies, characteristic names, badge lists). At 20 000 processes a row object per
 * process (with its process, site, weakest figure and project objects) was some 100 000 objects to build, copy
 * across threads and collect; these columns are some thirty arrays, and the page builds a row (listRowAt) only
 * for the rows it draws.
 */
export interface PortfolioListColumns {
  count: number;
  processIds: string[];
  processNames: string[];
  site: Int32Array;
  siteIds: string[];
  siteNames: string[];
  context: Int32Array;
  contextIds: string[];
  currency: Int32Array;
  currencies: string[];
  /** LIST_MEASURES position; −1 where the context has no profile. */
  measure: Int8Array;
  /** STATUS_ORDER position. */
  status: Uint8Array;
  /** RISK_CLASSES position. */
  risk: Uint8Array;
  /** 1 where z-levels are short-term (the context's convention). */
  shortTerm: Uint8Array;
  yield: Float64Array;
  ppm: Float64Array;
  zLevel: Float64Array;
  requiredZ: Float64Array;
  costPerYear: Float64Array;
  /** The weakest characteristic's name (a position in weakestNames; −1 for none) and its ruling figure. */
  weakest: Int32Array;
  weakestNames: string[];
  estimate: Float64Array;
  bound: Float64Array;
  required: Float64Array;
  cpk: Float64Array;
  ppk: Float64Array;
  /** The process's badges, as a position in badgeLists. */
  badges: Int32Array;
  badgeLists: Badge[][];
  /** The open projects of entry i: projectIds/projectPhases from projectStart[i] to projectStart[i + 1]. */
  projectStart: Int32Array;
  projectIds: string[];
  projectPhases: ImprovementProject['phase'][];
}

const known = (x: number): number | undefined => (Number.isNaN(x) ? undefined : x);

/** Whether entry i passes the filters: one rule for the list on screen and its CSV. */
export function passesFilters(list: PortfolioListColumns, i: number, f: PortfolioFilters): boolean {
  return (
    (!f.site || list.siteIds[list.site[i]!] === f.site) &&
    (!f.context || list.contextIds[list.context[i]!] === f.context) &&
    (!f.risk || RISK_CLASSES[list.risk[i]!] === f.risk) &&
    (!f.status || STATUS_ORDER[list.status[i]!] === f.status) &&
    (!f.project || (f.project === 'with') === list.projectStart[i + 1]! > list.projectStart[i]!)
  );
}

/** The entries the filters let through, in their order. */
export function filteredEntries(list: PortfolioListColumns, f: PortfolioFilters): Uint32Array {
  const out = new Uint32Array(list.count);
  let n = 0;
  for (let i = 0; i < list.count; i += 1) if (passesFilters(list, i, f)) out[n++] = i;
  return out.subarray(0, n);
}

/** Entry i as a list row, built when it is drawn. */
export function listRowAt(list: PortfolioListColumns, i: number): PortfolioListRow {
  const measure = list.measure[i]!;
  const row: PortfolioListRow = {
    process: {
      id: list.processIds[i]!,
      name: list.processNames[i]!,
      contextId: list.contextIds[list.context[i]!]!,
      currency: list.currencies[list.currency[i]!]!
    },
    site: { id: list.siteIds[list.site[i]!]!, name: list.siteNames[list.site[i]!]! },
    measure: measure < 0 ? undefined : LIST_MEASURES[measure],
    status: STATUS_ORDER[list.status[i]!]!,
    riskClass: RISK_CLASSES[list.risk[i]!]!,
    zBasis: list.shortTerm[i] ? 'short-term' : 'long-term',
    badges: list.badgeLists[list.badges[i]!]!,
    projects: []
  };
  const figures = { yield: list.yield, ppm: list.ppm, zLevel: list.zLevel, costPerYear: list.costPerYear };
  for (const key of ['yield', 'ppm', 'zLevel', 'costPerYear'] as const) {
    const x = known(figures[key][i]!);
    if (x !== undefined) row[key] = x;
  }
  const requiredZ = known(list.requiredZ[i]!);
  if (requiredZ !== undefined) row.requiredZ = requiredZ;
  const w = list.weakest[i]!;
  if (w >= 0) {
    const figure: NonNullable<PortfolioListRow['weakest']> = {
      name: list.weakestNames[w]!,
      required: list.required[i]!
    };
    const estimate = known(list.estimate[i]!);
    const bound = known(list.bound[i]!);
    const cpk = known(list.cpk[i]!);
    const ppk = known(list.ppk[i]!);
    if (estimate !== undefined) figure.estimate = estimate;
    if (bound !== undefined) figure.bound = bound;
    if (requiredZ !== undefined) figure.requiredZ = requiredZ;
    if (cpk !== undefined || ppk !== undefined) {
      figure.result = {};
      if (cpk !== undefined) figure.result.cpk = cpk;
      if (ppk !== undefined) figure.result.ppk = ppk;
    }
    row.weakest = figure;
  }
  for (let k = list.projectStart[i]!; k < list.projectStart[i + 1]!; k += 1)
    row.projects.push({ id: list.projectIds[k]!, phase: list.projectPhases[k]! });
  return row;
}

/** Some entries of a list (all, or those filters let through), as the table draws them: a length and a slice. */
export interface ListRows {
  readonly length: number;
  slice(from: number, to: number): PortfolioListRow[];
}

/** The entries of a list the filters let through, as ListRows. */
export function filteredRows(list: PortfolioListColumns, f: PortfolioFilters): ListRows {
  const entries = filteredEntries(list, f);
  return {
    length: entries.length,
    slice: (from, to) => Array.from(entries.subarray(from, to), (i) => listRowAt(list, i))
  };
}

/** What the page's summary and filter choices need of the whole list. */
export interface ListSummary {
  /** The sites and contexts that have a process in the list (sites by name, contexts by id). */
  sites: { id: string; name: string }[];
  contexts: string[];
  shortWithoutProject: number;
  projectsOnMeeting: number;
}

export function listSummary(list: PortfolioListColumns): ListSummary {
  const siteSeen = new Uint8Array(list.siteIds.length);
  const contextSeen = new Uint8Array(list.contextIds.length);
  const short = STATUS_ORDER.indexOf('short');
  const meetsShown = STATUS_ORDER.indexOf('meets, shown');
  let shortWithoutProject = 0;
  let projectsOnMeeting = 0;
  for (let i = 0; i < list.count; i += 1) {
    siteSeen[list.site[i]!] = 1;
    contextSeen[list.context[i]!] = 1;
    const withProject = list.projectStart[i + 1]! > list.projectStart[i]!;
    if (list.status[i] === short && !withProject) shortWithoutProject += 1;
    if (list.status[i] === meetsShown && withProject) projectsOnMeeting += 1;
  }
  return {
    sites: list.siteIds
      .map((id, k) => ({ id, name: list.siteNames[k]! }))
      .filter((_, k) => siteSeen[k])
      .sort((a, b) => a.name.localeCompare(b.name)),
    contexts: list.contextIds.filter((_, k) => contextSeen[k]).sort(),
    shortWithoutProject,
    projectsOnMeeting
  };
}

/** The list of a portfolio without processes. */
export const EMPTY_LIST: PortfolioListColumns = {
  count: 0,
  processIds: [],
  processNames: [],
  site: new Int32Array(0),
  siteIds: [],
  siteNames: [],
  context: new Int32Array(0),
  contextIds: [],
  currency: new Int32Array(0),
  currencies: [],
  measure: new Int8Array(0),
  status: new Uint8Array(0),
  risk: new Uint8Array(0),
  shortTerm: new Uint8Array(0),
  yield: new Float64Array(0),
  ppm: new Float64Array(0),
  zLevel: new Float64Array(0),
  requiredZ: new Float64Array(0),
  costPerYear: new Float64Array(0),
  weakest: new Int32Array(0),
  weakestNames: [],
  estimate: new Float64Array(0),
  bound: new Float64Array(0),
  required: new Float64Array(0),
  cpk: new Float64Array(0),
  ppk: new Float64Array(0),
  badges: new Int32Array(0),
  badgeLists: [],
  projectStart: new Int32Array(1),
  projectIds: [],
  projectPhases: []
};
