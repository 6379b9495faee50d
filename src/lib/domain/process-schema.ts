import { z } from 'zod';
import { MAX_COUNT, nonNegativeNumber, optionalText, recordId, requiredText } from './field-rules';
import { parseFields } from './parse-fields';
import type { ProcessFields } from './process';
import { isoTime } from './record-meta-schema';

/**
 * The validation of a process (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
export const processFieldsSchema = z.object({
  siteId: recordId('Site'),
  name: requiredText('Process name', 160),
  owner: optionalText('Owner', 120),
  contextId: requiredText('Industry context', 60),
  monthlyVolume: nonNegativeNumber('Monthly volume', MAX_COUNT),
  costPerDefective: nonNegativeNumber('Cost per defective unit'),
  currency: z
    .string({ error: 'Currency is required' })
    .regex(/^[A-Z]{3}$/, { error: 'Currency must be a three-letter ISO 4217 code such as EUR' }),
  archivedAt: isoTime('Archived at').optional()
});

export function parseProcessFields(input: unknown): ProcessFields {
  return parseFields('Process', processFieldsSchema, input);
}
