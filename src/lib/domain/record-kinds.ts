import type { Characteristic } from './characteristic';
import type { ContextProfileRecord } from './context-profile-record';
import type { ImprovementProject } from './improvement-project';
import type { QuarterReviewRecord } from './quarter-review-record';
import type { Process } from './process';
import type { Site } from './site';
import type { Study } from './study';

/**
 * The kinds of record that travel between devices, in the order a receiver needs them (a record's references
 * point to kinds before it). Device settings, drafts and study revisions stay on their device.
 */
export const RECORD_KINDS = [
  'contextProfiles',
  'sites',
  'processes',
  'characteristics',
  'studies',
  'projects',
  'reviews'
] as const;
export type RecordKind = (typeof RECORD_KINDS)[number];

export interface RecordsByKind {
  contextProfiles: ContextProfileRecord[];
  sites: Site[];
  processes: Process[];
  characteristics: Characteristic[];
  studies: Study[];
  projects: ImprovementProject[];
  reviews: QuarterReviewRecord[];
}

/** Singular names for messages ("study 3f…"). */
export const KIND_LABEL: Record<RecordKind, string> = {
  contextProfiles: 'context profile',
  sites: 'site',
  processes: 'process',
  characteristics: 'characteristic',
  studies: 'study',
  projects: 'improvement project',
  reviews: 'quarterly review'
};

export function emptyRecords(): RecordsByKind {
  return {
    contextProfiles: [],
    sites: [],
    processes: [],
    characteristics: [],
    studies: [],
    projects: [],
    reviews: []
  };
}

export function countRecords(records: RecordsByKind): Record<RecordKind, number> {
  return Object.fromEntries(RECORD_KINDS.map((k) => [k, records[k].length])) as Record<RecordKind, number>;
}
