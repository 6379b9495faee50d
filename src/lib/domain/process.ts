import { z } from 'zod';
import { MAX_COUNT, nonNegativeNumber, optionalText, recordId, requiredText } from './field-rules';
import { parseFields } from './parse-fields';
import type { RecordMeta } from './record-meta';
import { isoTime } from './record-meta-schema';

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
