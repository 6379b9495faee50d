import type { z } from 'zod';
import { ValidationError, type FieldProblem } from './validation-error';

/** `data.values[3]` rather than zod's array form, so messages read like the form a person filled in. */
function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out === '' ? String(part) : `.${String(part)}`;
  }
  return out === '' ? '(record)' : out;
}

/**
 * Validates unknown input against a schema and returns the parsed value, or throws a ValidationError that
 * lists every problem with its field. Parsing returns a fresh object: unknown keys are dropped, so no
 * stray property (`__proto__` included) reaches storage.
 */
export function parseFields<S extends z.ZodType>(recordKind: string, schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const problems: FieldProblem[] = result.error.issues.map((issue) => ({
    field: formatPath(issue.path),
    message: issue.message
  }));
  throw new ValidationError(recordKind, problems);
}
