import { z } from 'zod';

const isoTime = (label: string) =>
  z
    .string({ error: `${label} is required` })
    .refine((s) => !Number.isNaN(Date.parse(s)) && /^\d{4}-\d{2}-\d{2}T/.test(s), {
      error: `${label} must be an ISO 8601 date-time`
    });

/** Validation of the bookkeeping fields of a stored record (see record-meta.ts). */
export const recordMetaSchema = z.object({
  id: z.string({ error: 'id is required' }).uuid({ error: 'id must be a UUID' }),
  createdAt: isoTime('createdAt'),
  updatedAt: isoTime('updatedAt'),
  rev: z.number({ error: 'rev must be a number' }).int().min(1, { error: 'rev must be at least 1' }),
  deviceId: z.string({ error: 'deviceId is required' }).min(1).max(80),
  deletedAt: isoTime('deletedAt').optional()
});
