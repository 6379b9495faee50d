import type { RecordMeta } from './record-meta';

/** A plant, office or line location that reports its own processes. */
export interface SiteFields {
  name: string;
  region: string;
  /** IANA time zone name, e.g. `Europe/Oslo`; used to decide which month a local timestamp belongs to. */
  timeZone: string;
}
export type Site = SiteFields & RecordMeta;

export function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}
