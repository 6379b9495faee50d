import { z } from 'zod';

/**
 * Field rules shared by several record kinds, each with the message a person sees when it fails.
 * Messages say what is wrong in the terms of the form, not of the schema library.
 */

export const requiredText = (label: string, max = 200) =>
  z
    .string({
      error: (issue) => (issue.input === undefined ? `${label} is required` : `${label} must be text`)
    })
    .trim()
    .min(1, { error: `${label} is required` })
    .max(max, { error: `${label} must be at most ${max} characters` });

export const optionalText = (label: string, max = 200) =>
  z
    .string({ error: `${label} must be text` })
    .trim()
    .max(max, { error: `${label} must be at most ${max} characters` });

/** Any finite number; NaN, ±Infinity, numeric strings and empty cells are refused with the value shown. */
export const finiteNumber = (label: string) =>
  z.number({
    error: (issue) =>
      issue.input === undefined
        ? `${label} is required`
        : `${label} must be a finite number, got ${describeValue(issue.input)}`
  });

/**
 * Plausibility limits: values beyond them are typing, unit or paste errors, and they would overflow sums of
 * squares (1e308² is Infinity) or costs. Measured quantities (values, means, sds, limits) stay within ±10¹⁵ in
 * their unit; counts within 10¹² units; money within 10¹² per unit or per year.
 */
export const MAX_MEASURE = 1e15;
export const MAX_COUNT = 1e12;
export const MAX_MONEY = 1e12;

const tooLarge = (label: string, max: number) =>
  `${label} is implausibly large: at most ${max.toExponential(0).replace('e+', ' × 10^')} is accepted — check the unit and the decimal mark`;

/** A measured quantity in its unit: finite and within ±MAX_MEASURE. */
export const measureNumber = (label: string) =>
  finiteNumber(label)
    .min(-MAX_MEASURE, { error: tooLarge(label, MAX_MEASURE) })
    .max(MAX_MEASURE, { error: tooLarge(label, MAX_MEASURE) });

export const nonNegativeNumber = (label: string, max = MAX_MONEY) =>
  finiteNumber(label)
    .min(0, { error: `${label} must not be negative` })
    .max(max, { error: tooLarge(label, max) });

export const count = (label: string, max = MAX_COUNT) =>
  finiteNumber(label)
    .int({ error: `${label} must be a whole number` })
    .min(0, { error: `${label} must not be negative` })
    .max(max, { error: tooLarge(label, max) });

export const recordId = (label: string) =>
  z.string({ error: `${label} is required` }).uuid({ error: `${label} must be a record id (UUID)` });

export function describeValue(value: unknown): string {
  if (typeof value === 'string') return `'${value.length > 40 ? `${value.slice(0, 40)}…` : value}'`;
  if (typeof value === 'number') return String(value);
  if (value === null) return 'nothing';
  return typeof value;
}
