import type { WriteContext } from '../domain/record-meta';
import { type Site } from '../domain/site';
import { liveCountsUnder, removeWithContents, undoRemoval, type Removal } from './cascade-removal';
import { RecordRepository } from './record-repository';
import { lazyValidation } from './record-validation';
import type { CapstanDatabase } from './database';

/** What a site deletion touched, so that undo can bring back exactly that. */
export interface SiteRemoval {
  site: Site;
  deletedAt: string;
  counts: { processes: number; characteristics: number; studies: number; projects: number };
  removal: Removal;
}

/**
 * Sites, with deletion that cascades (cascade-removal.ts): a site's processes, characteristics, studies and
 * projects are tombstoned in the same transaction, and undo restores the ones that deletion tombstoned.
 */
export class SiteRepository extends RecordRepository<Site> {
  constructor(db: CapstanDatabase, ctx: WriteContext) {
    super(db, ctx, {
      kind: 'Site',
      table: (d) => d.sites,
      validation: lazyValidation(async () => {
        const { parseSiteFields, siteFieldsSchema } = await import('../domain/site-schema');
        return { parse: parseSiteFields, fields: Object.keys(siteFieldsSchema.shape) };
      })
    });
  }

  /** What deleting the site would take along, to confirm first. */
  countsUnder(id: string) {
    return liveCountsUnder(this.db, 'sites', id);
  }

  async removeWithContents(id: string): Promise<SiteRemoval> {
    const removal = await removeWithContents(this.db, this.ctx, 'sites', id);
    const c = removal.counts;
    return {
      site: removal.record as Site,
      deletedAt: removal.deletedAt,
      counts: {
        processes: c.processes ?? 0,
        characteristics: c.characteristics ?? 0,
        studies: c.studies ?? 0,
        projects: c.projects ?? 0
      },
      removal
    };
  }

  async undoRemoval(removal: SiteRemoval): Promise<void> {
    await undoRemoval(this.db, this.ctx, removal.removal);
  }
}
