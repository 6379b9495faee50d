import type { CapabilityResult } from '../stats/capability-result';

/**
 * How capability figures are written on screen: ppm with sensible digits, yield as a percentage, indices and
 * z-levels to two or three decimals. One place so every page shows a figure the same way.
 */
export function formatPpm(ppm: number | undefined): string {
  if (ppm === undefined || !Number.isFinite(ppm)) return '–';
  if (ppm === 0) return '0';
  if (ppm < 0.01) return ppm.toExponential(1);
  if (ppm < 10) return ppm.toFixed(2);
  if (ppm < 1000) return ppm.toFixed(1);
  return Math.round(ppm).toLocaleString();
}

export function formatYield(y: number | undefined): string {
  if (y === undefined || !Number.isFinite(y)) return '–';
  if (y >= 0.99999) return `${(y * 100).toFixed(5)} %`;
  if (y >= 0.999) return `${(y * 100).toFixed(3)} %`;
  return `${(y * 100).toFixed(2)} %`;
}

export function formatIndex(v: number | undefined, digits = 2): string {
  if (v === undefined) return '–';
  if (!Number.isFinite(v)) return v > 0 ? '∞' : '−∞';
  return v.toFixed(digits);
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
