import {
  parseCharacteristicFields,
  characteristicFieldsSchema,
  type Characteristic
} from '../domain/characteristic';
import { masterListCounts, processKeyOf, siteKeyOf, type MasterListPlan } from '../domain/master-list';
import { parseProcessFields, processFieldsSchema, type Process } from '../domain/process';
import { isLive, stampNew, stampUpdate, type WriteContext } from '../domain/record-meta';
import { parseSiteFields, siteFieldsSchema, type Site } from '../domain/site';
import { withLimitChange } from '../domain/specification-history';
import { ValidationError } from '../domain/validation-error';
import type { CapstanDatabase } from './database';
import { withoutFields } from './record-repository';

/**
 * Applies a checked master list (domain/master-list.ts) in one transaction: every new site, process and
 * characteristic, every update and every limit change, or nothing. A plan with bad rows is refused whole.
 */
export async function applyMasterList(db: CapstanDatabase, ctx: WriteContext, plan: MasterListPlan) {
  if (plan.badRows.length > 0) {
    throw new ValidationError('Master list', [
      {
        field: `line ${plan.badRows[0]!.line}`,
        message: `${plan.badRows.length} row(s) cannot be used; nothing was imported`
      }
    ]);
  }
  return db.transaction('rw', [db.sites, db.processes, db.characteristics], async () => {
    const sites = (await db.sites.toArray()).filter(isLive);
    const siteId = new Map(sites.map((s) => [siteKeyOf(s.name), s.id]));
    const siteName = new Map(sites.map((s) => [s.id, s.name]));
    const newSites: Site[] = plan.sites.create.map(({ key, ...fields }) => {
      const site = stampNew(parseSiteFields(fields), ctx) as Site;
      siteId.set(key, site.id);
      return site;
    });
    const siteUpdates: Site[] = [];
    for (const u of plan.sites.update) {
      const prev = await db.sites.get(u.id);
      if (prev)
        siteUpdates.push(
          stampUpdate(
            withoutFields(prev, Object.keys(siteFieldsSchema.shape)),
            parseSiteFields(u.fields),
            ctx
          )
        );
    }
    const processes = (await db.processes.toArray()).filter(isLive);
    const processId = new Map(
      processes.flatMap((p) => {
        const s = siteName.get(p.siteId);
        return s === undefined ? [] : [[processKeyOf(s, p.name), p.id] as const];
      })
    );
    const newProcesses: Process[] = plan.processes.create.map(({ key, siteKey, ...fields }) => {
      const process = stampNew(
        parseProcessFields({ ...fields, siteId: siteId.get(siteKey) }),
        ctx
      ) as Process;
      processId.set(key, process.id);
      return process;
    });
    const processUpdates: Process[] = [];
    for (const u of plan.processes.update) {
      const prev = await db.processes.get(u.id);
      if (prev)
        processUpdates.push(
          stampUpdate(
            withoutFields(prev, Object.keys(processFieldsSchema.shape)),
            parseProcessFields(u.fields),
            ctx
          )
        );
    }
    const newCharacteristics: Characteristic[] = plan.characteristics.create.map(
      ({ processKey, ...fields }) =>
        stampNew(
          parseCharacteristicFields({ ...fields, processId: processId.get(processKey) }),
          ctx
        ) as Characteristic
    );
    const changed = new Map<string, Characteristic>();
    const fieldKeys = Object.keys(characteristicFieldsSchema.shape);
    for (const u of plan.characteristics.update) {
      const prev = changed.get(u.id) ?? (await db.characteristics.get(u.id));
      if (prev)
        changed.set(
          u.id,
          stampUpdate(withoutFields(prev, fieldKeys), parseCharacteristicFields(u.fields), ctx)
        );
    }
    for (const l of plan.limitChanges) {
      const prev = changed.get(l.id) ?? (await db.characteristics.get(l.id));
      if (!prev) continue;
      const {
        id: _i,
        createdAt: _c,
        updatedAt: _u,
        rev: _r,
        deviceId: _d,
        vv: _v,
        clock: _k,
        localSeq: _l,
        ...rest
      } = prev;
      void [_i, _c, _u, _r, _d, _v, _k, _l];
      const fields = parseCharacteristicFields({ ...rest, limitChanges: withLimitChange(prev, l.change) });
      changed.set(l.id, stampUpdate(withoutFields(prev, fieldKeys), fields, ctx));
    }
    await db.sites.bulkPut([...newSites, ...siteUpdates]);
    await db.processes.bulkPut([...newProcesses, ...processUpdates]);
    await db.characteristics.bulkPut([...newCharacteristics, ...changed.values()]);
    return masterListCounts(plan);
  });
}
