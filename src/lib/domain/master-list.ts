import { DATA_KINDS, RISK_CLASSES, type Characteristic, type CharacteristicFields } from './characteristic';
import { characteristicFieldsSchema } from './characteristic-schema';
import type { ContextProfile } from './context-profile';
import { parseLocaleNumber } from './locale-number';
import { type Process, type ProcessFields } from './process';
import { processFieldsSchema } from './process-schema';
import { editableOf, isLive } from './record-meta';
import { type Site, type SiteFields } from './site';
import { siteFieldsSchema } from './site-schema';
import { limitsFor, type LimitChange, type Limits } from './specification-history';

/**
 * The master list: one row per characteristic, naming its site, process and limits — how a company sets up its
 * whole portfolio in one go, and keeps it up to date by importing an edited list again.
 *
 * Rows are matched by name (site, then process within the site, then characteristic within the process, case
 * and outer spaces ignored): a new name is added, a known one updated. Changed limits become a limit change from
 * a chosen month (earlier months keep theirs); nothing is ever duplicated. Every field is checked by the same
 * rules and messages as the forms; a row that breaks one is a bad row, named by its line with every reason, and
 * a list with bad rows is not applied (all or nothing).
 */
export const MASTER_LIST_COLUMNS = [
  { key: 'site', header: 'site', words: ['site', 'plant', 'location'] },
  { key: 'timeZone', header: 'time zone', words: ['time zone', 'timezone', 'tz'] },
  { key: 'region', header: 'region', words: ['region'] },
  { key: 'process', header: 'process', words: ['process'] },
  { key: 'owner', header: 'owner', words: ['owner'] },
  { key: 'context', header: 'context', words: ['context', 'industry context', 'industry'] },
  { key: 'monthlyVolume', header: 'monthly volume', words: ['monthly volume', 'volume'] },
  {
    key: 'costPerDefective',
    header: 'cost per defective',
    words: ['cost per defective', 'cost per defective unit', 'cost']
  },
  { key: 'currency', header: 'currency', words: ['currency'] },
  { key: 'characteristic', header: 'characteristic', words: ['characteristic', 'feature'] },
  { key: 'unit', header: 'unit', words: ['unit'] },
  { key: 'dataKind', header: 'data kind', words: ['data kind', 'kind', 'data'] },
  { key: 'lsl', header: 'lsl', words: ['lsl', 'lower limit', 'lower specification limit'] },
  { key: 'target', header: 'target', words: ['target', 'nominal'] },
  { key: 'usl', header: 'usl', words: ['usl', 'upper limit', 'upper specification limit'] },
  { key: 'riskClass', header: 'risk class', words: ['risk class', 'risk'] }
] as const;

export type MasterListKey = (typeof MASTER_LIST_COLUMNS)[number]['key'];
export type MasterListRow = { line: number } & Partial<Record<MasterListKey, string>>;

const normal = (s: string) =>
  s
    .trim()
    .toLowerCase()
    .replace(/[_\s]+/g, ' ');

/** Which column holds each key, from a header row (exact words first, so "cost per defective" is not "cost"). */
export function mapMasterListHeader(header: readonly string[]): Partial<Record<MasterListKey, number>> {
  const cells = header.map(normal);
  const out: Partial<Record<MasterListKey, number>> = {};
  const used = new Set<number>();
  for (const col of MASTER_LIST_COLUMNS) {
    for (const w of col.words) {
      const i = cells.findIndex((c, j) => !used.has(j) && c === w);
      if (i >= 0) {
        out[col.key] = i;
        used.add(i);
        break;
      }
    }
  }
  return out;
}

export const REQUIRED_MASTER_COLUMNS: MasterListKey[] = ['site', 'process', 'characteristic', 'dataKind'];

export interface MasterListPlan {
  sites: { create: (SiteFields & { key: string })[]; update: { id: string; fields: SiteFields }[] };
  processes: {
    create: (Omit<ProcessFields, 'siteId'> & { key: string; siteKey: string })[];
    update: { id: string; fields: ProcessFields }[];
  };
  characteristics: {
    create: (Omit<CharacteristicFields, 'processId'> & { processKey: string })[];
    update: { id: string; fields: CharacteristicFields }[];
  };
  /** Characteristics whose limits the list changes: a change from `fromPeriod`. */
  limitChanges: { id: string; name: string; change: LimitChange }[];
  badRows: { line: number; reasons: string[] }[];
  rows: number;
}

/** A plan that changes nothing, for `rows` rows read: where planning starts, and the answer to a list refused. */
export function emptyMasterListPlan(rows: number): MasterListPlan {
  return {
    sites: { create: [], update: [] },
    processes: { create: [], update: [] },
    characteristics: { create: [], update: [] },
    limitChanges: [],
    badRows: [],
    rows
  };
}

export interface ExistingPortfolio {
  sites: readonly Site[];
  processes: readonly Process[];
  characteristics: readonly Characteristic[];
}

/** The name keys rows are matched by: case and outer spaces ignored. */
export const siteKeyOf = (site: string) => normal(site);
export const processKeyOf = (site: string, process: string) => `${normal(site)}\u0000${normal(process)}`;

function contextOf(text: string, profiles: readonly ContextProfile[]): string | undefined {
  const t = normal(text);
  return profiles.find((p) => normal(p.id) === t || normal(p.label) === t)?.id;
}

/** The problems of a set of fields, computed once per distinct set. */
function checkedOnce(memo: Map<string, string[]>, fields: object, check: () => string[]): string[] {
  const key = JSON.stringify(fields);
  let found = memo.get(key);
  if (!found) {
    found = check();
    memo.set(key, found);
  }
  return found;
}

function problemsOf(
  result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } },
  label: Record<string, string>
) {
  if (result.success) return [];
  return result.error!.issues.map(
    (i) => `${label[String(i.path[0])] ?? String(i.path[0] ?? 'row')}: ${i.message}`
  );
}

const SITE_LABEL = { name: 'site', timeZone: 'time zone', region: 'region' };
const PROCESS_LABEL = {
  name: 'process',
  owner: 'owner',
  contextId: 'context',
  monthlyVolume: 'monthly volume',
  costPerDefective: 'cost per defective',
  currency: 'currency'
};
const CHARACTERISTIC_LABEL = {
  name: 'characteristic',
  unit: 'unit',
  dataKind: 'data kind',
  lsl: 'lsl',
  target: 'target',
  usl: 'usl',
  riskClass: 'risk class'
};

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

/**
 * Checks every row and works out what applying the list would do to the existing portfolio, without writing.
 * `decimal` is the list's decimal mark; `fromPeriod` the month changed limits take effect.
 */
export function planMasterList(
  rows: readonly MasterListRow[],
  existing: ExistingPortfolio,
  profiles: readonly ContextProfile[],
  options: {
    decimal: '.' | ',';
    fromPeriod: string;
    /** Called every 1 000 rows checked, for a progress bar. */
    onProgress?: (checked: number, total: number) => void;
  }
): MasterListPlan {
  const plan = emptyMasterListPlan(rows.length);
  const liveSites = existing.sites.filter(isLive);
  const siteByKey = new Map(liveSites.map((s) => [siteKeyOf(s.name), s]));
  const siteNameById = new Map(liveSites.map((s) => [s.id, s.name]));
  const liveProcesses = existing.processes.filter(isLive);
  const processByKey = new Map(
    liveProcesses.flatMap((p) => {
      const site = siteNameById.get(p.siteId);
      return site === undefined ? [] : [[processKeyOf(site, p.name), p] as const];
    })
  );
  const charsByProcess = new Map<string, Characteristic[]>();
  for (const c of existing.characteristics.filter(isLive)) {
    const list = charsByProcess.get(c.processId) ?? [];
    list.push(c);
    charsByProcess.set(c.processId, list);
  }
  // What the list itself says about each site and process, to catch two rows that disagree.
  const siteSeen = new Map<string, { fields: SiteFields; line: number }>();
  const processSeen = new Map<string, { fields: Omit<ProcessFields, 'siteId'>; line: number }>();
  const charSeen = new Map<string, number>();
  const num = (text: string | undefined, label: string, reasons: string[]) => {
    if (text === undefined || text.trim() === '') return undefined;
    const v = parseLocaleNumber(text, options.decimal);
    if (v === undefined) reasons.push(`${label}: '${text.trim()}' is not a number`);
    return v;
  };
  const good: {
    row: MasterListRow;
    site: SiteFields;
    process: Omit<ProcessFields, 'siteId'>;
    ch: Omit<CharacteristicFields, 'processId'>;
  }[] = [];

  // A site's and a process's fields repeat on every row of their characteristics: each distinct set is checked
  // once (the time-zone check alone costs tens of microseconds), so 20 000 rows plan in well under a second.
  const siteChecks = new Map<string, string[]>();
  const processChecks = new Map<string, string[]>();
  for (const [index, row] of rows.entries()) {
    if (options.onProgress && index % 1000 === 0 && index > 0) options.onProgress(index, rows.length);
    const reasons: string[] = [];
    const text = (k: MasterListKey) => (row[k] ?? '').trim();
    // Site.
    const site: SiteFields = { name: text('site'), region: text('region'), timeZone: text('timeZone') };
    const known = siteByKey.get(siteKeyOf(site.name));
    if (!site.timeZone && known) site.timeZone = known.timeZone;
    if (!site.region && known) site.region = known.region;
    reasons.push(
      ...checkedOnce(siteChecks, site, () => problemsOf(siteFieldsSchema.safeParse(site), SITE_LABEL))
    );
    // Process.
    const contextText = text('context');
    const contextId = contextText ? contextOf(contextText, profiles) : undefined;
    if (contextText && !contextId)
      reasons.push(`context: '${contextText}' is not a known industry context (use its name or id)`);
    const knownProcess = known ? processByKey.get(processKeyOf(known.name, text('process'))) : undefined;
    const process = {
      name: text('process'),
      owner: text('owner') || knownProcess?.owner || '',
      contextId: contextId ?? knownProcess?.contextId ?? '',
      monthlyVolume: num(row.monthlyVolume, 'monthly volume', reasons) ?? knownProcess?.monthlyVolume ?? 0,
      costPerDefective:
        num(row.costPerDefective, 'cost per defective', reasons) ?? knownProcess?.costPerDefective ?? 0,
      currency: (text('currency') || knownProcess?.currency || '').toUpperCase()
    };
    if (!contextText && !knownProcess)
      reasons.push('context: an industry context is required for a new process');
    const contextReported = reasons.some((r) => r.startsWith('context:'));
    reasons.push(
      ...checkedOnce(processChecks, process, () =>
        problemsOf(
          processFieldsSchema.safeParse({ ...process, siteId: '00000000-0000-4000-8000-000000000000' }),
          PROCESS_LABEL
        )
      ).filter((r) => !r.startsWith('siteId') && !(contextReported && r.startsWith('context:')))
    );
    // Characteristic.
    const kindText = normal(text('dataKind'));
    const dataKind = (DATA_KINDS as readonly string[]).includes(kindText)
      ? (kindText as CharacteristicFields['dataKind'])
      : undefined;
    if (!dataKind) reasons.push(`data kind: '${text('dataKind')}' must be 'measured' or 'counted'`);
    const riskText = normal(text('riskClass') || 'standard');
    const riskClass = (RISK_CLASSES as readonly string[]).includes(riskText)
      ? (riskText as CharacteristicFields['riskClass'])
      : undefined;
    if (!riskClass) reasons.push(`risk class: '${text('riskClass')}' must be 'standard', 'key' or 'safety'`);
    const limits: Limits = {};
    const lsl = num(row.lsl, 'lsl', reasons);
    const target = num(row.target, 'target', reasons);
    const usl = num(row.usl, 'usl', reasons);
    if (lsl !== undefined) limits.lsl = lsl;
    if (target !== undefined) limits.target = target;
    if (usl !== undefined) limits.usl = usl;
    const ch = {
      name: text('characteristic'),
      unit: text('unit'),
      dataKind: dataKind ?? 'measured',
      riskClass: riskClass ?? 'standard',
      ...limits
    };
    if (dataKind && riskClass) {
      reasons.push(
        ...problemsOf(
          characteristicFieldsSchema.safeParse({ ...ch, processId: '00000000-0000-4000-8000-000000000000' }),
          CHARACTERISTIC_LABEL
        ).filter((r) => !r.startsWith('processId'))
      );
    }
    // Rows that disagree with each other.
    const sKey = siteKeyOf(site.name);
    const pKey = processKeyOf(site.name, process.name);
    const cKey = `${pKey}\u0000${normal(ch.name)}`;
    const sPrev = siteSeen.get(sKey);
    if (sPrev && (sPrev.fields.timeZone !== site.timeZone || sPrev.fields.region !== site.region))
      reasons.push(`site: '${site.name}' has another time zone or region on line ${sPrev.line}`);
    const pPrev = processSeen.get(pKey);
    if (pPrev && !same(pPrev.fields, process))
      reasons.push(
        `process: '${process.name}' has other owner, context, volume, cost or currency on line ${pPrev.line}`
      );
    const cPrev = charSeen.get(cKey);
    if (cPrev !== undefined)
      reasons.push(
        `characteristic: '${ch.name}' appears twice in process '${process.name}' (also line ${cPrev})`
      );
    if (reasons.length > 0) {
      plan.badRows.push({ line: row.line, reasons });
      continue;
    }
    if (!sPrev) siteSeen.set(sKey, { fields: site, line: row.line });
    if (!pPrev) processSeen.set(pKey, { fields: process, line: row.line });
    charSeen.set(cKey, row.line);
    good.push({ row, site, process, ch });
  }

  // Sets, not searches of the growing lists: a list of 20 000 rows must plan in well under a second.
  const createdSites = new Set<string>();
  const updatedSites = new Set<string>();
  const createdProcesses = new Set<string>();
  const updatedProcesses = new Set<string>();
  for (const { site } of good) {
    const key = siteKeyOf(site.name);
    const known = siteByKey.get(key);
    if (!known) {
      if (!createdSites.has(key)) {
        createdSites.add(key);
        plan.sites.create.push({ ...site, key });
      }
    } else if (
      (known.timeZone !== site.timeZone || known.region !== site.region) &&
      !updatedSites.has(known.id)
    ) {
      updatedSites.add(known.id);
      plan.sites.update.push({
        id: known.id,
        fields: { name: known.name, region: site.region, timeZone: site.timeZone }
      });
    }
  }
  for (const { site, process } of good) {
    const key = processKeyOf(site.name, process.name);
    const knownSite = siteByKey.get(siteKeyOf(site.name));
    const known = knownSite ? processByKey.get(processKeyOf(knownSite.name, process.name)) : undefined;
    if (!known) {
      if (!createdProcesses.has(key)) {
        createdProcesses.add(key);
        plan.processes.create.push({ ...process, key, siteKey: siteKeyOf(site.name) });
      }
    } else {
      const fields: ProcessFields = {
        ...process,
        name: known.name,
        siteId: known.siteId,
        ...(known.archivedAt ? { archivedAt: known.archivedAt } : {})
      };
      const changed = (['owner', 'contextId', 'monthlyVolume', 'costPerDefective', 'currency'] as const).some(
        (k) => known[k] !== fields[k]
      );
      if (changed && !updatedProcesses.has(known.id)) {
        updatedProcesses.add(known.id);
        plan.processes.update.push({ id: known.id, fields });
      }
    }
  }
  for (const { site, process, ch, row } of good) {
    const knownSite = siteByKey.get(siteKeyOf(site.name));
    const knownProcess = knownSite ? processByKey.get(processKeyOf(knownSite.name, process.name)) : undefined;
    const known = knownProcess
      ? (charsByProcess.get(knownProcess.id) ?? []).find((c) => normal(c.name) === normal(ch.name))
      : undefined;
    if (!known) {
      plan.characteristics.create.push({ ...ch, processKey: processKeyOf(site.name, process.name) });
      continue;
    }
    if (known.dataKind !== ch.dataKind) {
      plan.badRows.push({
        line: row.line,
        reasons: [
          `data kind: '${known.name}' is ${known.dataKind}; a characteristic's data kind cannot change (add a new one)`
        ]
      });
      continue;
    }
    if (known.unit !== ch.unit || known.riskClass !== ch.riskClass) {
      const fields = editableOf(known);
      plan.characteristics.update.push({
        id: known.id,
        fields: { ...fields, unit: ch.unit, riskClass: ch.riskClass }
      });
    }
    const now = limitsFor(known, options.fromPeriod);
    const next: Limits = {
      ...(ch.lsl !== undefined ? { lsl: ch.lsl } : {}),
      ...(ch.target !== undefined ? { target: ch.target } : {}),
      ...(ch.usl !== undefined ? { usl: ch.usl } : {})
    };
    if (!same(now, next))
      plan.limitChanges.push({
        id: known.id,
        name: known.name,
        change: { from: options.fromPeriod, ...next }
      });
  }
  plan.badRows.sort((a, b) => a.line - b.line);
  return plan;
}

/** How many records the plan adds and changes, for a summary line. */
export function masterListCounts(plan: MasterListPlan) {
  return {
    newSites: plan.sites.create.length,
    updatedSites: plan.sites.update.length,
    newProcesses: plan.processes.create.length,
    updatedProcesses: plan.processes.update.length,
    newCharacteristics: plan.characteristics.create.length,
    updatedCharacteristics: plan.characteristics.update.length,
    limitChanges: plan.limitChanges.length,
    badRows: plan.badRows.length
  };
}
