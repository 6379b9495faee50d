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

/** Plural names for counts ("3 studies"). */
export const KIND_PLURAL: Record<RecordKind, string> = {
  contextProfiles: 'context profiles',
  sites: 'sites',
  processes: 'processes',
  characteristics: 'characteristics',
  studies: 'studies',
  projects: 'improvement projects',
  reviews: 'quarterly reviews'
};

/** "1 study", "3 studies". */
export function countOfKind(kind: RecordKind, n: number): string {
  return `${n.toLocaleString('en')} ${n === 1 ? KIND_LABEL[kind] : KIND_PLURAL[kind]}`;
}

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

/** The reference each kind holds to its parent: a record cannot stay live once its parent is deleted. */
export const PARENT_OF: Partial<Record<RecordKind, { field: string; kind: RecordKind }>> = {
  processes: { field: 'siteId', kind: 'sites' },
  characteristics: { field: 'processId', kind: 'processes' },
  studies: { field: 'characteristicId', kind: 'characteristics' },
  projects: { field: 'processId', kind: 'processes' }
};

/** Kinds whose records have children, parents first, and the kinds of their children. */
export const CHILD_KINDS: Partial<Record<RecordKind, RecordKind[]>> = {
  sites: ['processes'],
  processes: ['characteristics', 'projects'],
  characteristics: ['studies']
};

/** The id of a record's parent, or undefined for kinds without one. */
export function parentIdOf(kind: RecordKind, record: unknown): string | undefined {
  const p = PARENT_OF[kind];
  return p ? ((record as Record<string, unknown>)[p.field] as string | undefined) : undefined;
}
