import { z } from 'zod';
import { characteristicFieldsSchema } from '../domain/characteristic-schema';
import { contextProfileFieldsSchema } from '../domain/context-profile-record-schema';
import { isClockStamp } from '../domain/hybrid-clock';
import { improvementProjectFieldsSchema } from '../domain/improvement-project-schema';
import { processFieldsSchema } from '../domain/process-schema';
import { quarterReviewFieldsSchema } from '../domain/quarter-review-record-schema';
import { RECORD_KINDS } from '../domain/record-kinds';
import { DEVICE_ID_RULE } from '../domain/device-id';
import { deviceIdSchema, isoTime, recordMetaSchema } from '../domain/record-meta-schema';
import { siteFieldsSchema } from '../domain/site-schema';
import { MAX_RECORDS_PER_KIND } from './exchange-guards';
import { studyFieldsSchema } from '../domain/study-schema';

/**
 * Schema of an exchange file (format version 1), checked with zod after the envelope and the hash. Record
 * schemas are the ones every save uses, plus complete bookkeeping (version vector and clock stamp), so a file
 * can only carry records this app could have written itself.
 */
export const EXCHANGE_FORMAT = 'capstan-exchange';
export const EXCHANGE_FORMAT_VERSION = 1;

const deviceId = deviceIdSchema;

/** Complete bookkeeping of a travelling record: the version vector and the clock stamp. */
const exchangeMeta = recordMetaSchema.extend({
  vv: z
    .record(
      deviceId,
      z
        .number({ error: 'write counts must be numbers' })
        .int({ error: 'write counts must be whole numbers' })
        .min(1, { error: 'write counts must be at least 1' })
        .max(Number.MAX_SAFE_INTEGER, { error: 'write counts are implausibly large' }),
      { error: `vv (version vector) must map device ids to write counts; ${DEVICE_ID_RULE}` }
    )
    .refine((v) => Object.keys(v).length >= 1 && Object.keys(v).length <= 1000, {
      error: 'vv (version vector) must name between 1 and 1000 devices'
    }),
  clock: z
    .string({ error: 'clock is required' })
    .refine(isClockStamp, { error: 'clock is not a clock stamp' })
});

const withMeta = <S extends z.ZodObject>(schema: S) => schema.extend(exchangeMeta.shape);

export const exchangeRecordSchemas = {
  contextProfiles: withMeta(contextProfileFieldsSchema),
  sites: withMeta(siteFieldsSchema),
  processes: withMeta(processFieldsSchema),
  // Characteristic and project schemas carry cross-field checks, which zod's safeExtend keeps.
  characteristics: characteristicFieldsSchema.safeExtend(exchangeMeta.shape),
  studies: withMeta(studyFieldsSchema),
  projects: improvementProjectFieldsSchema.safeExtend(exchangeMeta.shape),
  reviews: withMeta(quarterReviewFieldsSchema)
} as const;

const countsSchema = z.strictObject(
  Object.fromEntries(
    RECORD_KINDS.map((k) => [k, z.number({ error: 'must be a whole number of records' }).int().min(0)])
  ) as Record<(typeof RECORD_KINDS)[number], z.ZodNumber>,
  { error: 'header.counts must give a count for each record kind' }
);

const peer = z.strictObject({ deviceId, name: z.string().max(120) });

export const scopeSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('everything') }),
    z.strictObject({ kind: z.literal('site'), siteId: z.string().uuid(), siteName: z.string().max(200) }),
    z.strictObject({ kind: z.literal('changes'), recipient: peer, since: isoTime('since').optional() }),
    z.strictObject({ kind: z.literal('merged'), sources: z.array(z.string().max(300)).max(10) })
  ],
  { error: "header.scope.kind must be 'everything', 'site', 'changes' or 'merged'" }
);

export const headerSchema = z.strictObject(
  {
    appVersion: z.string({ error: 'appVersion must be text' }).max(40),
    exportedBy: z.strictObject({ deviceId, deviceName: z.string().max(120) }),
    exportedAt: isoTime('exportedAt'),
    scope: scopeSchema,
    counts: countsSchema,
    latestClock: z.string().refine(isClockStamp, { error: 'latestClock is not a clock stamp' }).optional()
  },
  { error: 'the header is missing or is not an object' }
);

export const recordsSchema = z.strictObject(
  Object.fromEntries(
    RECORD_KINDS.map((k) => [
      k,
      z.array(exchangeRecordSchemas[k], { error: 'must be a list of records' }).max(MAX_RECORDS_PER_KIND)
    ])
  ) as { [K in (typeof RECORD_KINDS)[number]]: z.ZodArray<(typeof exchangeRecordSchemas)[K]> },
  { error: 'records must hold a list for each record kind' }
);

export const exchangeFileSchema = z.strictObject({
  format: z.literal(EXCHANGE_FORMAT),
  formatVersion: z.literal(EXCHANGE_FORMAT_VERSION),
  header: headerSchema,
  records: recordsSchema,
  sha256: z.string().regex(/^[0-9a-f]{64}$/)
});

export type ExchangeHeader = z.output<typeof headerSchema>;
export type ExportScopeHeader = z.output<typeof scopeSchema>;
