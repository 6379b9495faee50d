import type { CapabilityResult } from '../stats/capability-result';

/**
 * How capability figures are written on screen: ppm with sensible digits, yield as a percentage, indices and
 * z-levels to two or three decimals. One place so every page shows a figure the same way.
 */
/** Fixed decimals in the reader's locale (decimal comma where the browser's language uses one). */
function fixed(v: number, digits: number): string {
  return v.toLocaleString(undefined, { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

export function formatPpm(ppm: number | undefined): string {
  if (ppm === undefined || !Number.isFinite(ppm)) return '–';
  if (ppm === 0) return '0';
  if (ppm < 0.01) return ppm.toExponential(1);
  if (ppm < 10) return fixed(ppm, 2);
  if (ppm < 1000) return fixed(ppm, 1);
  return fixed(Math.round(ppm), 0);
}

export function formatYield(y: number | undefined): string {
  if (y === undefined || !Number.isFinite(y)) return '–';
  if (y >= 0.99999) return `${fixed(y * 100, 5)} %`;
  if (y >= 0.999) return `${fixed(y * 100, 3)} %`;
  return `${fixed(y * 100, 2)} %`;
}

export function formatIndex(v: number | undefined, digits = 2): string {
  if (v === undefined) return '–';
  if (!Number.isFinite(v)) return v > 0 ? '∞' : '−∞';
  return fixed(v, digits);
}

/** The index a study is judged by: Cpk where a within sigma exists, otherwise Ppk. */
export function rulingIndex(r: CapabilityResult): {
  name: 'Cpk' | 'Ppk';
  value: number | undefined;
  lowerBound: number | undefined;
} {
  if (r.cpk !== undefined) return { name: 'Cpk', value: r.cpk, lowerBound: r.intervals.cpk?.lowerBound };
  return { name: 'Ppk', value: r.ppk, lowerBound: r.intervals.ppk?.lowerBound };
}
