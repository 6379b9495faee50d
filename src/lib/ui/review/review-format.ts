import { formatMoney } from '../format';

/** How the review writes its figures: shares as whole percents, costs per currency, p-values briefly. */
export function formatShare(share: number | undefined): string {
  return share === undefined ? '–' : `${Math.round(share * 100)} %`;
}

export function formatCosts(cost: readonly { currency: string; perYear: number }[]): string {
  return cost.length === 0 ? '–' : cost.map((c) => formatMoney(c.perYear, c.currency)).join(' + ');
}

export function formatChange(v: number | undefined, digits = 2): string {
  if (v === undefined || !Number.isFinite(v)) return '–';
  const text = Math.abs(v).toLocaleString(undefined, {
    minimumFractionDigits: digits,
    maximumFractionDigits: digits
  });
  return v > 0 ? `+${text}` : v < 0 ? `−${text}` : text;
}

export function formatP(p: number | undefined): string {
  if (p === undefined) return 'not testable';
  return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}
