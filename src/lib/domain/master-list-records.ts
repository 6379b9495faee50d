import { type Characteristic } from './characteristic';
import { characteristicFieldsSchema, parseCharacteristicFields } from './characteristic-schema';
import { processKeyOf, siteKeyOf, type ExistingPortfolio, type MasterListPlan } from './master-list';
import { type Process } from './process';
import { parseProcessFields, processFieldsSchema } from './process-schema';
import { editableOf, isLive, stampNew, stampUpdate, withoutFields, type WriteContext } from './record-meta';
import { type Site } from './site';
import { parseSiteFields, siteFieldsSchema } from './site-schema';
import { withLimitChange } from './specification-history';
import { ValidationError } from './validation-error';

/**
 * The records a checked master list (master-list.ts) writes: new sites, processes and characteristics stamped
 * for this device, and new versions of the ones it updates or whose limits it changes. One home for how a plan
 * becomes records — the app stores them in one transaction, the command line writes them to an exchange file.
 *
 * New characteristics come in chunks (`characteristicChunks`), so that a caller on a page can store each chunk
 * and hand the main thread back in between.
 */
export interface MasterListRecords {
  sites: Site[];
  processes: Process[];
  /** Existing characteristics with new fields or limits. */
  changedCharacteristics: Characteristic[];
  newCharacteristicCount: number;
  characteristicChunks(size: number): Generator<Characteristic[]>;
}

export function masterListRecords(
  plan: MasterListPlan,
  existing: ExistingPortfolio,
  ctx: WriteContext
): MasterListRecords {
  if (plan.badRows.length > 0) {
    throw new ValidationError('Master list', [
      {
        field: `line ${plan.badRows[0]!.line}`,
        message: `${plan.badRows.length} row(s) cannot be used; nothing was imported`
      }
    ]);
  }
  const sites = existing.sites.filter(isLive);
  const siteById = new Map(sites.map((s) => [s.id, s]));
  const siteId = new Map(sites.map((s) => [siteKeyOf(s.name), s.id]));
  const out: Site[] = plan.sites.create.map(({ key, ...fields }) => {
    const site = stampNew(parseSiteFields(fields), ctx) as Site;
    siteId.set(key, site.id);
    return site;
  });
  const siteKeys = Object.keys(siteFieldsSchema.shape);
  for (const u of plan.sites.update) {
    const prev = siteById.get(u.id);
    if (prev) out.push(stampUpdate(withoutFields(prev, siteKeys), parseSiteFields(u.fields), ctx));
  }

  const processes = existing.processes.filter(isLive);
  const processById = new Map(processes.map((p) => [p.id, p]));
  const processId = new Map(
    processes.flatMap((p) => {
      const s = siteById.get(p.siteId);
      return s === undefined ? [] : [[processKeyOf(s.name, p.name), p.id] as const];
    })
  );
  const outProcesses: Process[] = plan.processes.create.map(({ key, siteKey, ...fields }) => {
    const process = stampNew(parseProcessFields({ ...fields, siteId: siteId.get(siteKey) }), ctx) as Process;
    processId.set(key, process.id);
    return process;
  });
  const processKeys = Object.keys(processFieldsSchema.shape);
  for (const u of plan.processes.update) {
    const prev = processById.get(u.id);
    if (prev)
      outProcesses.push(stampUpdate(withoutFields(prev, processKeys), parseProcessFields(u.fields), ctx));
  }

  const charById = new Map(existing.characteristics.filter(isLive).map((c) => [c.id, c]));
  const changed = new Map<string, Characteristic>();
  const charKeys = Object.keys(characteristicFieldsSchema.shape);
  for (const u of plan.characteristics.update) {
    const prev = changed.get(u.id) ?? charById.get(u.id);
    if (prev)
      changed.set(u.id, stampUpdate(withoutFields(prev, charKeys), parseCharacteristicFields(u.fields), ctx));
  }
  for (const l of plan.limitChanges) {
    const prev = changed.get(l.id) ?? charById.get(l.id);
    if (!prev) continue;
    const fields = parseCharacteristicFields({
      ...editableOf(prev),
      limitChanges: withLimitChange(prev, l.change)
    });
    changed.set(l.id, stampUpdate(withoutFields(prev, charKeys), fields, ctx));
  }

  const create = plan.characteristics.create;
  return {
    sites: out,
    processes: outProcesses,
    changedCharacteristics: [...changed.values()],
    newCharacteristicCount: create.length,
    *characteristicChunks(size: number) {
      for (let at = 0; at < create.length; at += size) {
        yield create
          .slice(at, at + size)
          .map(
            ({ processKey, ...fields }) =>
              stampNew(
                parseCharacteristicFields({ ...fields, processId: processId.get(processKey) }),
                ctx
              ) as Characteristic
          );
      }
    }
  };
}
