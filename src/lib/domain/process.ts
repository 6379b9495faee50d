import type { RecordMeta } from './record-meta';

/** A process run at one site, whose characteristics are studied each month. */
export interface ProcessFields {
  siteId: string;
  name: string;
  owner: string;
  /** Id of the industry context whose targets apply. */
  contextId: string;
  /** Units (or transactions) made per month; scales cost of poor quality. */
  monthlyVolume: number;
  /** What one defective unit costs, in `currency`. */
  costPerDefective: number;
  /** ISO 4217 code, e.g. EUR. */
  currency: string;
  /** Set while the process is archived: its history is kept, but it leaves the ranking and the review. */
  archivedAt?: string;
}
export type Process = ProcessFields & RecordMeta;
