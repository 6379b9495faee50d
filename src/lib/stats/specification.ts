/** Specification limits and target of a characteristic; either limit may be missing, never both. */
export interface Specification {
  lsl?: number;
  usl?: number;
  target?: number;
}

export function checkSpecification(spec: Specification): void {
  if (spec.lsl === undefined && spec.usl === undefined)
    throw new RangeError('At least one specification limit (LSL or USL) is needed');
  if (spec.lsl !== undefined && spec.usl !== undefined && !(spec.lsl < spec.usl)) {
    throw new RangeError(`LSL (${spec.lsl}) must be less than USL (${spec.usl})`);
  }
}
