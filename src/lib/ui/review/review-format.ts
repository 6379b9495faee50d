import { formatPValue } from '../../domain/figure-format';
import { formatFixed } from '../capability-format';
import { formatMoney } from '../format';

/** How the review writes its figures: shares as whole percents, costs per currency, p-values briefly. */
export { formatShare } from '../../domain/figure-format';

/**
 * Amounts per currency side by side ("€8,945 · ₹2,100,000"), never joined by a plus sign: they are not added.
 * With a total in the reporting currency (only given when every currency has a rate), it follows as "≈ …".
 */
export function formatCosts(
  cost: readonly { currency: string; perYear: number }[],
  reporting?: { currency: string; amount: number }
): string {
  if (cost.length === 0) return '–';
  const each = cost.map((c) => formatMoney(c.perYear, c.currency)).join(' · ');
  return reporting && cost.length > 1
    ? `${each} (≈ ${formatMoney(reporting.amount, reporting.currency)})`
    : each;
}

export function formatChange(v: number | undefined, digits = 2): string {
  if (v === undefined || !Number.isFinite(v)) return '–';
  const text = formatFixed(Math.abs(v), digits);
  return v > 0 ? `+${text}` : v < 0 ? `−${text}` : text;
}

/** A p-value by the figure policy, as the review writes it: "p < 0.001", "p = 0.214". */
export function formatP(p: number | undefined): string {
  if (p === undefined) return 'not testable';
  const text = formatPValue(p);
  return text.startsWith('<') ? `p ${text}` : `p = ${text}`;
}
