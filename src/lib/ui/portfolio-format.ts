import type { RulingMeasure } from '../domain/context-profile';
import type { RulingFigure } from '../domain/portfolio-list-row';
import { formatIndex, formatPpm } from './capability-format';

/** "Cpk 1.12 (bound 0.98) vs 1.33", in the unit of the measure that rules the context. */
export function rulingText(row: RulingFigure, measure: RulingMeasure | undefined): string {
  if (row.estimate === undefined) return '–';
  const bound =
    row.bound !== undefined
      ? ` (bound ${measure === 'ppm' ? formatPpm(row.bound) : formatIndex(row.bound)})`
      : '';
  switch (measure) {
    case 'index': {
      const name =
        row.result?.cpk !== undefined ? 'Cpk' : row.result?.ppk !== undefined ? 'Ppk' : 'index equiv. z/3';
      return `${name} ${formatIndex(row.estimate)}${bound} vs ≥ ${formatIndex(row.required)}`;
    }
    case 'zLevel':
      return `z ${formatIndex(row.estimate)}${bound} vs ≥ ${formatIndex(row.required)}`;
    case 'ppm':
      return `ppm ${formatPpm(row.estimate)}${bound} vs ≤ ${formatPpm(row.required)}`;
    default:
      return '–';
  }
}

/** The tag colour of a status: short warns, shown meeting is good, the rest plain. */
export const statusClass = (s: string) => (s === 'short' ? 'warn' : s === 'meets, shown' ? 'good' : '');
