import { decimalMarkOf, parseLocaleNumber } from '../../domain/locale-number';
import { countOfKind, type RecordKind } from '../../domain/record-kinds';
import type { FieldProblem } from '../../domain/validation-error';

/** The browser's decimal mark, for numbers typed into the set-up forms. */
export const DECIMAL = decimalMarkOf(typeof navigator === 'undefined' ? undefined : navigator.language);

/**
 * A typed number as the record wants it: empty is "not given" (undefined), a number is read with the
 * browser's decimal mark, and anything else is passed on as text so that validation names the field.
 */
export function typedNumber(text: string): number | string | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  return parseLocaleNumber(t, DECIMAL) ?? t;
}

/** A number for a form field (empty when absent). */
export function numberText(v: number | undefined): string {
  return v === undefined ? '' : String(v).replace('.', DECIMAL);
}

/** The message for one field among a validation's problems. */
export function problemFor(problems: readonly FieldProblem[], field: string): string | undefined {
  return problems.find((p) => p.field === field || p.field.startsWith(`${field}.`))?.message;
}

/** "3 characteristics, 40 studies": what a deletion would take along. */
export function countsText(counts: Partial<Record<RecordKind, number>>): string {
  const parts = Object.entries(counts)
    .filter(([, n]) => (n ?? 0) > 0)
    .map(([k, n]) => countOfKind(k as RecordKind, n ?? 0));
  return parts.length === 0 ? 'nothing else' : parts.join(', ');
}
