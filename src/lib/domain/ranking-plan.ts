import type { Characteristic } from './characteristic';
import type { ImprovementProject } from './improvement-project';
import type { MonthlyStatistics } from './monthly-statistics';
import { portfolioIndex } from './portfolio-index';
import type { PortfolioRecords } from './portfolio-terms';
import type { Process } from './process';
import type { Site } from './site';

/**
 * The processes a ranking walks, resolved once per record set and read-model version: each process the portfolio
 * shows (live, not archived, of a live site; in the records' order) with its site, its characteristics (as the
 * portfolio index orders them), their rows in the read model and its open projects. A ranking, each quarter of
 * the review and each recompute otherwise looked each of these up by id in maps of 20 000 strings — in the
 * benchmark at 20 000 processes, a tenth of the review's time.
 */
export interface RankingPlan {
  processes: Process[];
  sites: Site[];
  characteristics: (readonly Characteristic[])[];
  /**
   * The read-model rows of the characteristics of every process, one after another: those of process i from
   * `rows[start[i]]`, in the order of `characteristics[i]`; −1 for a characteristic without a study.
   */
  start: Int32Array;
  rows: Int32Array;
  openProjects: (ImprovementProject[] | undefined)[];
}

const NO_CHARACTERISTICS: readonly Characteristic[] = Object.freeze([]);

/**
 * Plans kept per process array (the review ranks a few processes of the same records now and then, each time
 * in an array of their own: keyed by the model, their plans pushed out the whole portfolio's, and everything
 * kept with it), for the read model, its version and the other record arrays they were made from. Rows never
 * move in a model (they are only added), but a characteristic without a row gets one when its first study is
 * written — which changes the version.
 */
const plans = new WeakMap<
  readonly Process[],
  {
    model: MonthlyStatistics;
    version: number;
    characteristics: readonly Characteristic[];
    sites: readonly Site[];
    projects: readonly ImprovementProject[];
    plan: RankingPlan;
  }
>();

/** The plan of these records over this read model (built on first use, then kept while neither changes). */
export function rankingPlan(records: PortfolioRecords, model: MonthlyStatistics): RankingPlan {
  const kept = plans.get(records.processes);
  if (
    kept &&
    kept.model === model &&
    kept.version === model.version &&
    kept.characteristics === records.characteristics &&
    kept.sites === records.sites &&
    kept.projects === records.projects
  )
    return kept.plan;
  const plan = planOf(records, model);
  plans.set(records.processes, {
    model,
    version: model.version,
    characteristics: records.characteristics,
    sites: records.sites,
    projects: records.projects,
    plan
  });
  return plan;
}

function planOf(records: PortfolioRecords, model: MonthlyStatistics): RankingPlan {
  const index = portfolioIndex(records);
  const processes: Process[] = [];
  const sites: Site[] = [];
  const characteristics: (readonly Characteristic[])[] = [];
  const openProjects: (ImprovementProject[] | undefined)[] = [];
  let rowCount = 0;
  for (const process of records.processes) {
    if (process.deletedAt || process.archivedAt) continue;
    const site = index.sites.get(process.siteId);
    if (!site) continue;
    const chars = index.characteristics.get(process.id) ?? NO_CHARACTERISTICS;
    processes.push(process);
    sites.push(site);
    characteristics.push(chars);
    openProjects.push(index.openProjects.get(process.id));
    rowCount += chars.length;
  }
  const start = new Int32Array(processes.length + 1);
  const rows = new Int32Array(rowCount);
  let at = 0;
  for (let p = 0; p < processes.length; p += 1) {
    start[p] = at;
    for (const c of characteristics[p]!) rows[at++] = model.rowOf(c.id) ?? -1;
  }
  start[processes.length] = at;
  return { processes, sites, characteristics, start, rows, openProjects };
}
