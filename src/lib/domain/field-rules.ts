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

export const nonNegativeNumber = (label: string) =>
  finiteNumber(label).min(0, { error: `${label} must not be negative` });

export const count = (label: string) =>
  finiteNumber(label)
    .int({ error: `${label} must be a whole number` })
    .min(0, { error: `${label} must not be negative` });

export const recordId = (label: string) =>
  z.string({ error: `${label} is required` }).uuid({ error: `${label} must be a record id (UUID)` });

export function describeValue(value: unknown): string {
  if (typeof value === 'string') return `'${value.length > 40 ? `${value.slice(0, 40)}…` : value}'`;
  if (typeof value === 'number') return String(value);
  if (value === null) return 'nothing';
  return typeof value;
}
