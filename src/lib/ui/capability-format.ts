import type { CapabilityResult } from '../stats/capability-result';

/**
 * How capability figures are written on screen: ppm with sensible digits, yield as a percentage, indices and
 * z-levels to two or three decimals. One place so every page shows a figure the same way.
 */
const fixedFormats = new Map<number, Intl.NumberFormat>();

/**
 * Fixed decimals in the reader's locale (decimal comma where the browser's language uses one). One formatter per
 * number of decimals, made once: `toLocaleString` with options builds a new one at every call, which cost
 * seconds on a review of 2 000 processes.
 */
export function formatFixed(v: number, digits: number): string {
  let format = fixedFormats.get(digits);
  if (!format) {
    format = new Intl.NumberFormat(undefined, {
      minimumFractionDigits: digits,
      maximumFractionDigits: digits
    });
    fixedFormats.set(digits, format);
  }
  return format.format(v);
}

export function formatPpm(ppm: number | undefined): string {
  if (ppm === undefined || !Number.isFinite(ppm)) return '–';
  if (ppm === 0) return '0';
  if (ppm < 0.01) return ppm.toExponential(1);
  if (ppm < 10) return formatFixed(ppm, 2);
  if (ppm < 1000) return formatFixed(ppm, 1);
  return formatFixed(Math.round(ppm), 0);
}

export function formatYield(y: number | undefined): string {
  if (y === undefined || !Number.isFinite(y)) return '–';
  if (y >= 0.99999) return `${formatFixed(y * 100, 5)} %`;
  if (y >= 0.999) return `${formatFixed(y * 100, 3)} %`;
  return `${formatFixed(y * 100, 2)} %`;
}

export function formatIndex(v: number | undefined, digits = 2): string {
  if (v === undefined) return '–';
  if (!Number.isFinite(v)) return v > 0 ? '∞' : '−∞';
  return formatFixed(v, digits);
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
