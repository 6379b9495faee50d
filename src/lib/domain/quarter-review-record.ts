import type { RecordMeta } from './record-meta';
import type { ReviewFigures } from './review-figures';

/**
 * A quarterly review as kept: which quarter and sites, the manager's comment on each section, and, once the
 * review has been presented, a frozen copy of its figures. Synchronised like every other record, so notes and
 * snapshots travel in exchange files.
 */
export const REVIEW_SECTIONS = [
  'headline',
  'shortfalls',
  'movers',
  'sites',
  'pipeline',
  'assumptions'
] as const;
export type ReviewSection = (typeof REVIEW_SECTIONS)[number];

export interface QuarterReviewFields {
  quarter: string;
  /** Sorted; empty means every site. */
  siteIds: string[];
  notes: Partial<Record<ReviewSection, string>>;
  snapshot?: { frozenAt: string; figures: ReviewFigures };
}
export type QuarterReviewRecord = QuarterReviewFields & RecordMeta;

export const MAX_NOTE_LENGTH = 4000;

/** Which review a quarter and a set of sites name (the set in any order). */
export function reviewKey(quarter: string, siteIds: readonly string[]): string {
  return `${quarter}|${[...siteIds].sort().join(',')}`;
}
