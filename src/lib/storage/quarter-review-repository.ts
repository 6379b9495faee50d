import {
  reviewKey,
  type QuarterReviewFields,
  type QuarterReviewRecord,
  type ReviewSection
} from '../domain/quarter-review-record';
import { isLive, stampNew, stampUpdate, type Editable, type WriteContext } from '../domain/record-meta';
import type { ReviewFigures } from '../domain/review-figures';
import type { CapstanDatabase } from './database';
import { withoutFields } from './record-repository';
import { lazyValidation } from './record-validation';

const validation = lazyValidation(async () => {
  const m = await import('../domain/quarter-review-record-schema');
  return { parse: m.parseQuarterReviewFields, fields: Object.keys(m.quarterReviewFieldsSchema.shape) };
});

/** Quarterly reviews: one record per quarter and set of sites, created on the first note or freeze. */
export class QuarterReviewRepository {
  constructor(
    private readonly db: CapstanDatabase,
    private readonly ctx: WriteContext
  ) {}

  async find(quarter: string, siteIds: readonly string[]): Promise<QuarterReviewRecord | undefined> {
    const key = reviewKey(quarter, siteIds);
    return (await this.db.reviews.where('quarter').equals(quarter).toArray()).find(
      (r) => isLive(r) && reviewKey(r.quarter, r.siteIds) === key
    );
  }

  private async change(
    quarter: string,
    siteIds: readonly string[],
    edit: (fields: QuarterReviewFields) => QuarterReviewFields
  ): Promise<QuarterReviewRecord> {
    // Loaded before the transaction: waiting on a module inside one would end it.
    const { parse, fields: known } = await validation();
    return this.db.transaction('rw', this.db.reviews, async () => {
      const existing = await this.find(quarter, siteIds);
      const base: QuarterReviewFields = existing
        ? {
            quarter: existing.quarter,
            siteIds: existing.siteIds,
            notes: existing.notes,
            snapshot: existing.snapshot
          }
        : { quarter, siteIds: [...siteIds].sort(), notes: {} };
      const fields = parse(edit(base));
      const record = existing
        ? stampUpdate(withoutFields(existing, known), fields as Editable<QuarterReviewRecord>, this.ctx)
        : (stampNew(fields, this.ctx) as QuarterReviewRecord);
      if (!fields.snapshot) delete record.snapshot;
      await this.db.reviews.put(record);
      return record;
    });
  }

  saveNote(quarter: string, siteIds: readonly string[], section: ReviewSection, note: string) {
    return this.change(quarter, siteIds, (f) => ({ ...f, notes: { ...f.notes, [section]: note } }));
  }

  /** Keeps the figures as they are now, for the review as presented. */
  freeze(quarter: string, siteIds: readonly string[], figures: ReviewFigures, at: string) {
    return this.change(quarter, siteIds, (f) => ({ ...f, snapshot: { frozenAt: at, figures } }));
  }

  unfreeze(quarter: string, siteIds: readonly string[]) {
    return this.change(quarter, siteIds, (f) => ({ ...f, snapshot: undefined }));
  }
}
