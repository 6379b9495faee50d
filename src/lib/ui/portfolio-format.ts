import type { RulingMeasure } from '../domain/context-profile';
import type { RulingFigure } from '../domain/portfolio-list-row';
import { formatIndex, formatPpm } from './capability-format';

/**
 * "Cpk 1.12 (bound 0.98) vs ≥ 1.33", in the unit of the measure that rules the context. Counted data have no
 * index: against an index requirement they are judged on their z-level against 3 × the index, and say so. A
 * ppm is always of defective units (for defects, units with at least one defect), as the ranking judges it.
 */
export function rulingText(row: RulingFigure, measure: RulingMeasure | undefined): string {
  if (row.estimate === undefined) return '–';
  const write = measure === 'ppm' ? (v: number) => `${formatPpm(v)} ppm` : formatIndex;
  const bound = row.bound !== undefined ? ` (bound ${write(row.bound)})` : '';
  switch (measure) {
    case 'index': {
      const name = row.result?.cpk !== undefined ? 'Cpk' : row.result?.ppk !== undefined ? 'Ppk' : undefined;
      if (name) return `${name} ${formatIndex(row.estimate)}${bound} vs ≥ ${formatIndex(row.required)}`;
      const needed = row.requiredZ !== undefined ? ` vs ≥ ${formatIndex(row.requiredZ)}` : '';
      return `z ${formatIndex(row.estimate)}${bound}${needed} (3 × index ${formatIndex(row.required)})`;
    }
    case 'zLevel':
      return `z ${formatIndex(row.estimate)}${bound} vs ≥ ${formatIndex(row.required)}`;
    case 'ppm':
      return `${write(row.estimate)} defective${bound} vs ≤ ${write(row.required)}`;
    default:
      return '–';
  }
}

/** The tag colour of a status: short warns, shown meeting is good, the rest plain. */
export const statusClass = (s: string) => (s === 'short' ? 'warn' : s === 'meets, shown' ? 'good' : '');
