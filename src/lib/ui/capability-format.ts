import type { CapabilityResult } from '../stats/capability-result';

/**
 * The figure policy (domain/figure-format.ts) as the pages use it: the reader's locale, thousands grouped. The
 * rules live there, one home for the pages, the CSV and the command line.
 */
export { formatFixed, formatIndex, formatPpm, formatSignificant, formatYield } from '../domain/figure-format';

/** The index a study is judged by: Cpk where a within sigma exists, otherwise Ppk. */
export function rulingIndex(r: CapabilityResult): {
  name: 'Cpk' | 'Ppk';
  value: number | undefined;
  lowerBound: number | undefined;
} {
  if (r.cpk !== undefined) return { name: 'Cpk', value: r.cpk, lowerBound: r.intervals.cpk?.lowerBound };
  return { name: 'Ppk', value: r.ppk, lowerBound: r.intervals.ppk?.lowerBound };
}
