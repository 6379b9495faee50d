import { z } from 'zod';

/**
 * The figures of a quarterly review, as plain data: what the review page and the printed report show, and
 * what a frozen snapshot keeps. One shape for live and frozen figures, validated with zod when it comes from
 * storage or a file, so a snapshot made by another device can be shown safely.
 */
const num = z.number();
const optNum = z.number().optional();
const text = z.string().max(400);

const costSchema = z.array(z.object({ currency: z.string().max(8), perYear: num })).max(50);
/** A total in the reporting currency, given only when every currency involved has a rate. */
const reportingAmount = z.object({ currency: z.string().max(8), amount: num }).optional();

export const headlineSchema = z.object({
  quarter: z.string().max(10),
  processes: num,
  reviewed: num,
  meeting: num,
  meetingShown: num,
  share: optNum,
  shareShown: optNum,
  cost: costSchema,
  costReporting: reportingAmount,
  stale: num,
  missing: num
});

const processLineSchema = z.object({
  processId: z.string().max(80),
  process: text,
  site: text,
  status: z.string().max(40),
  zLevel: optNum,
  /** Whether the z-levels of this line are long-term or short-term (absent in snapshots frozen before). */
  zBasis: z.enum(['long-term', 'short-term']).optional(),
  required: optNum,
  /** The required z-level as the ranking defines it (absent in snapshots frozen before it was kept). */
  requiredZ: optNum,
  zGap: optNum,
  ppm: optNum,
  costPerYear: optNum,
  currency: z.string().max(8),
  weakest: text.optional(),
  spreadOrCentre: z.enum(['spread', 'centring']).optional(),
  priority: num
});

const moverSchema = z.object({
  processId: z.string().max(80),
  process: text,
  site: text,
  characteristic: text,
  zBefore: num,
  zAfter: num,
  change: num,
  ppmBefore: num,
  ppmAfter: num,
  pValue: optNum,
  beyondNoise: z.boolean().optional(),
  /** Closed in the quarter (absent: still running in Control). */
  closed: z.boolean().optional(),
  /** The result the project reports for itself, beside the one the figures show. */
  reportedResult: text.optional(),
  reportedLevel: optNum
});

const siteSchema = z.object({
  siteId: z.string().max(80),
  site: text,
  processes: num,
  reviewed: num,
  meeting: num,
  share: optNum,
  cost: costSchema,
  zLevels: z.array(num).max(100_000),
  medianZ: optNum
});

const controlSchema = z.object({
  projectId: z.string().max(80),
  title: text,
  process: text,
  currency: z.string().max(8),
  expectedSaving: num,
  beforeQuarter: z.string().max(10),
  zBefore: optNum,
  zAfter: optNum,
  costBefore: optNum,
  costAfter: optNum,
  achievedSaving: optNum,
  pValue: optNum,
  beyondNoise: z.boolean().optional(),
  /** Closed in the quarter (absent: still running in Control). */
  closed: z.boolean().optional(),
  /** The result the project reports for itself, beside the one the figures show. */
  reportedResult: text.optional(),
  reportedLevel: optNum
});

export const reviewFiguresSchema = z.object({
  quarter: z.string().max(10),
  previousQuarter: z.string().max(10),
  yearAgoQuarter: z.string().max(10),
  siteIds: z.array(z.string().max(80)).max(1000),
  headline: headlineSchema,
  previous: headlineSchema,
  yearAgo: headlineSchema,
  processes: z.array(processLineSchema).max(100_000),
  /** Every process with a z-level in both quarters; improvers and decliners are those beyond noise. */
  movers: z.array(moverSchema).max(100_000),
  improvers: z.array(moverSchema).max(100),
  decliners: z.array(moverSchema).max(100),
  movedWithinNoise: num,
  sites: z.array(siteSchema).max(1000),
  shareTrend: z
    .array(z.object({ quarter: z.string().max(10), reviewed: num, share: optNum, shareShown: optNum }))
    .max(40),
  pipeline: z
    .array(
      z.object({
        phase: z.string().max(20),
        projects: num,
        /** Expected yearly saving per currency (never added across currencies). */
        savings: costSchema.optional(),
        savingReporting: reportingAmount,
        /** Snapshots frozen before per-currency savings hold one number here; it is no longer written. */
        expectedSaving: optNum
      })
    )
    .max(10),
  /** The reporting currency and rates used for converted totals (absent when none is set). */
  reporting: z
    .object({
      currency: z.string().max(8),
      rates: z.array(z.object({ currency: z.string().max(8), rate: num, asOf: z.string().max(10) })).max(200),
      statement: z.string().max(4000)
    })
    .optional(),
  control: z.array(controlSchema).max(10_000),
  assumptions: z
    .array(
      z.object({
        topic: z.string().max(40),
        explanation: z.string().max(600),
        processes: z.array(text).max(100_000)
      })
    )
    .max(20)
});

export type ReviewHeadline = z.output<typeof headlineSchema>;
export type ReviewProcessLine = z.output<typeof processLineSchema>;
export type ReviewMover = z.output<typeof moverSchema>;
export type ReviewSite = z.output<typeof siteSchema>;
export type ReviewControlProject = z.output<typeof controlSchema>;
export type ReviewFigures = z.output<typeof reviewFiguresSchema>;
