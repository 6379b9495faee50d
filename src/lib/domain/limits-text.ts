import { formatAsEntered, PRINTED, type NumberStyle } from './figure-format';
import type { Limits } from './specification-history';

/**
 * A specification in words: "LSL 9.5 · target 10 · USL 10.5", naming only the limits there are ("USL 0.4" for a
 * one-sided one), "no limits" when there is none (counted data are judged on their defect rate, not on limits).
 * Each limit is written as it was entered. One home for the pages, the messages and the command line.
 */
export function limitsText(limits: Limits, style: NumberStyle = PRINTED, separator = ' · '): string {
  const parts: string[] = [];
  const write = (v: number) => formatAsEntered(v, style);
  if (limits.lsl !== undefined) parts.push(`LSL ${write(limits.lsl)}`);
  if (limits.target !== undefined) parts.push(`target ${write(limits.target)}`);
  if (limits.usl !== undefined) parts.push(`USL ${write(limits.usl)}`);
  return parts.length ? parts.join(separator) : 'no limits';
}
