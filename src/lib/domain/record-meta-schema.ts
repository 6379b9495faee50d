import { z } from 'zod';
import { DEVICE_ID_RULE, isDeviceId } from './device-id';
import { calendarTimeMs } from './time-bounds';

/** An ISO 8601 date-time that is a real calendar instant between 2000 and 2199 (time-bounds.ts). */
export const isoTime = (label: string) =>
  z
    .string({ error: `${label} must be a date-time` })
    .max(40, { error: `${label} must be an ISO 8601 date-time` })
    .refine((s) => calendarTimeMs(s) !== undefined, {
      error: (issue) =>
        `${label} ${JSON.stringify(String(issue.input).slice(0, 40))} is not a real date-time between 2000 and 2199 written as ISO 8601 (2026-11-03T08:15:00.000Z)`
    });

export const deviceIdSchema = z.string({ error: 'device id must be text' }).refine(isDeviceId, {
  error: (issue) => `${JSON.stringify(String(issue.input).slice(0, 40))}: ${DEVICE_ID_RULE}`
});

/** Validation of the bookkeeping fields of a stored record (see record-meta.ts). */
export const recordMetaSchema = z.object({
  id: z.string({ error: 'id is required' }).uuid({ error: 'id must be a UUID' }),
  createdAt: isoTime('createdAt'),
  updatedAt: isoTime('updatedAt'),
  rev: z
    .number({ error: 'rev must be a number' })
    .int({ error: 'rev must be a whole number' })
    .min(1, { error: 'rev must be at least 1' })
    .max(Number.MAX_SAFE_INTEGER, { error: 'rev is implausibly large' }),
  deviceId: deviceIdSchema,
  deletedAt: isoTime('deletedAt').optional()
});
