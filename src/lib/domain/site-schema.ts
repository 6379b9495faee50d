import { z } from 'zod';
import { optionalText, requiredText } from './field-rules';
import { parseFields } from './parse-fields';
import { isTimeZone, type SiteFields } from './site';

/**
 * The validation of a site (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
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
