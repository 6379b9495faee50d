/** One problem with one field of an input, said so that a person can fix it. */
export interface FieldProblem {
  /** Path of the field, e.g. `usl` or `data.values[3]`. */
  field: string;
  message: string;
}

/**
 * Thrown when input is refused. Nothing has been written when it is thrown: validation always runs before
 * any storage call.
 */
export class ValidationError extends Error {
  readonly problems: FieldProblem[];
  readonly recordKind: string;

  constructor(recordKind: string, problems: FieldProblem[]) {
    super(`${recordKind} not saved: ${problems.map((p) => `${p.field} — ${p.message}`).join('; ')}`);
    this.name = 'ValidationError';
    this.recordKind = recordKind;
    this.problems = problems;
  }
}
