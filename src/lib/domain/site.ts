import type { RecordMeta } from './record-meta';

/** A plant, office or line location that reports its own processes. */
export interface SiteFields {
  name: string;
  region: string;
  /** IANA time zone name, e.g. `Europe/Oslo`; used to decide which month a local timestamp belongs to. */
  timeZone: string;
}
export type Site = SiteFields & RecordMeta;

/** Names already asked about: building a formatter costs about a millisecond, and a file repeats a few zones. */
const knownZones = new Map<string, boolean>();

export function isTimeZone(name: string): boolean {
  let known = knownZones.get(name);
  if (known === undefined) {
    try {
      new Intl.DateTimeFormat('en', { timeZone: name });
      known = true;
    } catch {
      known = false;
    }
    if (knownZones.size < 1000) knownZones.set(name, known);
  }
  return known;
}
