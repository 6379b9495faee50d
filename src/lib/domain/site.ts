import { z } from 'zod';
import { optionalText, requiredText } from './field-rules';
import { parseFields } from './parse-fields';
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

export const siteFieldsSchema = z.object({
  name: requiredText('Site name', 120),
  region: optionalText('Region', 120),
  timeZone: z.string({ error: 'Time zone is required' }).refine(isTimeZone, {
    error: (issue) => `'${String(issue.input)}' is not a known time zone (e.g. Europe/Oslo)`
  })
});

export function parseSiteFields(input: unknown): SiteFields {
  return parseFields('Site', siteFieldsSchema, input);
}
