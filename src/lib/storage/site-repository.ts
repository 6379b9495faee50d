import {
  isLive,
  stampDeleted,
  stampRestored,
  type RecordMeta,
  type WriteContext
} from '../domain/record-meta';
import { parseSiteFields, type Site } from '../domain/site';
import type { Table } from 'dexie';
import { RecordNotFoundError, RecordRepository } from './record-repository';
import type { CapstanDatabase } from './database';

/** What a site deletion touched, so that undo can bring back exactly that. */
export interface SiteRemoval {
  site: Site;
  deletedAt: string;
  counts: { processes: number; characteristics: number; studies: number; projects: number };
}

/**
 * Sites, with deletion that cascades: a site's processes, characteristics, studies and projects are
 * tombstoned in the same transaction, and undo restores the ones that deletion tombstoned (same time stamp).
 */
export class SiteRepository extends RecordRepository<Site> {
  constructor(db: CapstanDatabase, ctx: WriteContext) {
    super(db, ctx, { kind: 'Site', table: (d) => d.sites, parse: parseSiteFields });
  }

  private allTables(): Table[] {
    const d = this.db;
    return [d.sites, d.processes, d.characteristics, d.studies, d.projects] as unknown as Table[];
  }

  async removeWithContents(id: string): Promise<SiteRemoval> {
    const d = this.db;
    return d.transaction('rw', this.allTables(), async () => {
      const site = await d.sites.get(id);
      if (!site || !isLive(site)) throw new RecordNotFoundError('Site', id);
      // The deletion time marks what this deletion takes along (undo and merges bring back exactly those). A
      // record under the site deleted on its own in the same millisecond must not share it: move on by 1 ms.
      const taken = await this.deletionTimesUnder(id);
      let ms = this.ctx.now().getTime();
      while (taken.has(new Date(ms).toISOString())) ms += 1;
      const fixedClock = { ...this.ctx, now: () => new Date(ms) };
      const tombstone = stampDeleted(site, fixedClock);
      const at = tombstone.deletedAt as string;
      const bury = async <T extends RecordMeta>(table: Table<T, string>, rows: T[]) => {
        const live = rows.filter(isLive);
        await table.bulkPut(live.map((r) => stampDeleted(r, fixedClock)));
        return live;
      };
      const processes = await bury(d.processes, await d.processes.where('siteId').equals(id).toArray());
      const processIds = processes.map((p) => p.id);
      const characteristics = await bury(
        d.characteristics,
        await d.characteristics.where('processId').anyOf(processIds).toArray()
      );
      const studies = await bury(
        d.studies,
        await d.studies
          .where('characteristicId')
          .anyOf(characteristics.map((c) => c.id))
          .toArray()
      );
      const projects = await bury(
        d.projects,
        await d.projects.where('processId').anyOf(processIds).toArray()
      );
      await d.sites.put(tombstone);
      return {
        site: tombstone,
        deletedAt: at,
        counts: {
          processes: processes.length,
          characteristics: characteristics.length,
          studies: studies.length,
          projects: projects.length
        }
      };
    });
  }

  /** Deletion times of the records under a site that are already deleted. */
  private async deletionTimesUnder(siteId: string): Promise<Set<string>> {
    const d = this.db;
    const out = new Set<string>();
    const note = (rows: RecordMeta[]) => {
      for (const r of rows) if (r.deletedAt) out.add(r.deletedAt);
    };
    const processes = await d.processes.where('siteId').equals(siteId).toArray();
    note(processes);
    const processIds = processes.map((p) => p.id);
    const characteristics = await d.characteristics.where('processId').anyOf(processIds).toArray();
    note(characteristics);
    note(
      await d.studies
        .where('characteristicId')
        .anyOf(characteristics.map((c) => c.id))
        .toArray()
    );
    note(await d.projects.where('processId').anyOf(processIds).toArray());
    return out;
  }

  async undoRemoval(removal: SiteRemoval): Promise<void> {
    const d = this.db;
    const at = removal.deletedAt;
    await d.transaction('rw', this.allTables(), async () => {
      const raise = async <T extends RecordMeta>(table: Table<T, string>, rows: T[]) => {
        const buried = rows.filter((r) => r.deletedAt === at);
        await table.bulkPut(buried.map((r) => stampRestored(r, this.ctx)));
        return buried;
      };
      const site = await d.sites.get(removal.site.id);
      if (!site || site.deletedAt !== at) throw new RecordNotFoundError('Deleted site', removal.site.id);
      await raise(d.sites, [site]);
      const processes = await raise(
        d.processes,
        await d.processes.where('siteId').equals(removal.site.id).toArray()
      );
      const processIds = processes.map((p) => p.id);
      const characteristics = await raise(
        d.characteristics,
        await d.characteristics.where('processId').anyOf(processIds).toArray()
      );
      await raise(
        d.studies,
        await d.studies
          .where('characteristicId')
          .anyOf(characteristics.map((c) => c.id))
          .toArray()
      );
      await raise(d.projects, await d.projects.where('processId').anyOf(processIds).toArray());
    });
  }
}
