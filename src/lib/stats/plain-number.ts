/**
 * Numbers inside the engine's own words (assumptions, warnings, model labels): positional notation, a decimal
 * point, no grouping — never scientific notation. The figures on pages, in the CSV and in the command line's
 * tables are written by the figure policy (domain/figure-format.ts), which builds on these.
 */

/** Below this a p-value is written "< 0.001": a smaller one says nothing more to a reader deciding on it. */
export const P_VALUE_FLOOR = 0.001;

/** Decimals that show `digits` significant digits of v (0 for numbers with that many whole digits). */
export function decimalsFor(v: number, digits: number): number {
  if (v === 0 || !Number.isFinite(v)) return 0;
  return Math.min(20, Math.max(0, digits - 1 - Math.floor(Math.log10(Math.abs(v)))));
}

/** v to `digits` significant digits, positional however small or large. */
export function plainSignificant(v: number, digits: number): string {
  if (!Number.isFinite(v)) return Number.isNaN(v) ? 'NaN' : v > 0 ? '∞' : '−∞';
  // Rounding can carry into a new digit (0.0996 → 0.10): the decimals are those of the rounded value.
  const rounded = Number(v.toPrecision(digits));
  return rounded.toFixed(decimalsFor(rounded, digits));
}

/** A p-value: "< 0.001", or three decimals. */
export function plainPValue(p: number): string {
  return p < P_VALUE_FLOOR ? `< ${P_VALUE_FLOOR}` : p.toFixed(3);
}
