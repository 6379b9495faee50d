import { zBasisOf } from './context-profile';
import { LIST_MEASURES, type PortfolioListColumns } from './portfolio-list-columns';
import type { RankedPortfolio } from './portfolio-ranking';
import type { RankingPlan } from './ranking-plan';
import type { Badge } from './portfolio-terms';

/** Positions of strings (or lists) in a table built as they are met. */
class Table<T> {
  readonly items: T[] = [];
  readonly #at = new Map<T, number>();
  of(item: T): number {
    let at = this.#at.get(item);
    if (at === undefined) this.#at.set(item, (at = this.items.push(item) - 1));
    return at;
  }
}

/**
 * What the list's columns hold of each process of a plan whatever the ranking — its id and name, its site,
 * context and currency as positions in their tables — and the position of each characteristic's name (by the
 * plan's rows, as `plan.rows`), worked out once per plan: looking each of them up in a table for every process
 * of every ranking was most of the time the columns took.
 */
type PlanColumns = Pick<
  PortfolioListColumns,
  | 'processIds'
  | 'processNames'
  | 'site'
  | 'siteIds'
  | 'siteNames'
  | 'context'
  | 'contextIds'
  | 'currency'
  | 'currencies'
> & { name: Int32Array; names: string[] };

const planColumns = new WeakMap<RankingPlan, PlanColumns>();

function planColumnsOf(plan: RankingPlan): PlanColumns {
  let kept = planColumns.get(plan);
  if (kept) return kept;
  const count = plan.processes.length;
  const sites = new Table<string>();
  const siteNames: string[] = [];
  const contexts = new Table<string>();
  const currencies = new Table<string>();
  const names = new Table<string>();
  kept = {
    processIds: plan.processes.map((p) => p.id),
    processNames: plan.processes.map((p) => p.name),
    site: new Int32Array(count),
    siteIds: sites.items,
    siteNames,
    context: new Int32Array(count),
    contextIds: contexts.items,
    currency: new Int32Array(count),
    currencies: currencies.items,
    name: new Int32Array(plan.rows.length),
    names: names.items
  };
  for (let p = 0; p < count; p += 1) {
    const process = plan.processes[p]!;
    const s = sites.of(plan.sites[p]!.id);
    siteNames[s] = plan.sites[p]!.name;
    kept.site[p] = s;
    kept.context[p] = contexts.of(process.contextId);
    kept.currency[p] = currencies.of(process.currency);
    const chars = plan.characteristics[p]!;
    for (let k = 0; k < chars.length; k += 1) kept.name[plan.start[p]! + k] = names.of(chars[k]!.name);
  }
  planColumns.set(plan, kept);
  return kept;
}

/**
 * A column in the ranking's order, one function per array type: one generic helper for the four types ran cold
 * (as a worker's first ranking does) at a fraction of the speed.
 */
function inOrderF64(byPlan: Float64Array, order: Uint32Array): Float64Array {
  const out = new Float64Array(order.length);
  for (let i = 0; i < order.length; i += 1) out[i] = byPlan[order[i]!]!;
  return out;
}
function inOrderI32(byPlan: Int32Array, order: Uint32Array): Int32Array {
  const out = new Int32Array(order.length);
  for (let i = 0; i < order.length; i += 1) out[i] = byPlan[order[i]!]!;
  return out;
}
function inOrderU8(byPlan: Uint8Array, order: Uint32Array): Uint8Array {
  const out = new Uint8Array(order.length);
  for (let i = 0; i < order.length; i += 1) out[i] = byPlan[order[i]!]!;
  return out;
}
function inOrderI8(byPlan: Int8Array, order: Uint32Array): Int8Array {
  const out = new Int8Array(order.length);
  for (let i = 0; i < order.length; i += 1) out[i] = byPlan[order[i]!]!;
  return out;
}

/**
 * The ranked list's columns (PortfolioListColumns) from a ranking's numbers, in its order: the figures of each
 * process as its full row (rowAt) has them, without building the row. A figure not known is NaN.
 *
 * Read in the plan's order, then put in the ranking's: the processes' objects lie in memory in the plan's
 * order, and reading them in ranked order (a shuffle of it) missed the processor's cache at nearly every one.
 */
export function listColumnsOf(ranked: RankedPortfolio): PortfolioListColumns {
  const { plan, order } = ranked;
  const count = order.length;
  const fixed = planColumnsOf(plan);
  const badgeLists = new Table<Badge[]>();
  // In the plan's order: the profile's measure and basis, the weakest's name, the badges.
  const measure = new Int8Array(count);
  const shortTerm = new Uint8Array(count);
  const weakest = new Int32Array(count);
  const badges = new Int32Array(count);
  const judged = ranked.judged;
  for (let p = 0; p < count; p += 1) {
    const profile = ranked.profileAt(p);
    measure[p] = profile ? LIST_MEASURES.indexOf(profile.measure) : -1;
    shortTerm[p] = zBasisOf(profile) === 'short-term' ? 1 : 0;
    const w = judged.weakest[p]!;
    weakest[p] = w >= 0 ? fixed.name[plan.start[p]! + w]! : -1;
    badges[p] = badgeLists.of(ranked.badgesAt(p));
  }
  const list: PortfolioListColumns = {
    count,
    processIds: new Array<string>(count),
    processNames: new Array<string>(count),
    site: inOrderI32(fixed.site, order),
    siteIds: fixed.siteIds,
    siteNames: fixed.siteNames,
    context: inOrderI32(fixed.context, order),
    contextIds: fixed.contextIds,
    currency: inOrderI32(fixed.currency, order),
    currencies: fixed.currencies,
    measure: inOrderI8(measure, order),
    status: inOrderU8(ranked.status, order),
    risk: inOrderU8(judged.risk, order),
    shortTerm: inOrderU8(shortTerm, order),
    yield: inOrderF64(ranked.yield, order),
    ppm: new Float64Array(count),
    zLevel: inOrderF64(ranked.zLevel, order),
    requiredZ: inOrderF64(judged.requiredZ, order),
    costPerYear: inOrderF64(ranked.costPerYear, order),
    weakest: inOrderI32(weakest, order),
    weakestNames: fixed.names,
    estimate: inOrderF64(judged.estimate, order),
    bound: inOrderF64(judged.bound, order),
    required: inOrderF64(judged.required, order),
    cpk: inOrderF64(judged.cpk, order),
    ppk: inOrderF64(judged.ppk, order),
    badges: inOrderI32(badges, order),
    badgeLists: badgeLists.items,
    projectStart: new Int32Array(count + 1),
    projectIds: [],
    projectPhases: []
  };
  for (let i = 0; i < count; i += 1) {
    const p = order[i]!;
    list.processIds[i] = fixed.processIds[p]!;
    list.processNames[i] = fixed.processNames[p]!;
    list.ppm[i] = (1 - list.yield[i]!) * 1e6;
    const projects = plan.openProjects[p];
    if (projects)
      for (const project of projects) {
        list.projectIds.push(project.id);
        list.projectPhases.push(project.phase);
      }
    list.projectStart[i + 1] = list.projectIds.length;
  }
  return list;
}
