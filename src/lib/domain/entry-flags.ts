import type { CapabilityResult } from '../stats/capability-result';

/**
 * Why a logged month deserves a second look before the portfolio uses it: the things a site lead can check at
 * the machine (a value outside physical bounds, instability, no spread, no model that fits). Small samples are
 * not flagged here — they are common and the figures already carry that warning.
 */
export function entryFlags(result: CapabilityResult): string[] {
  const flags: string[] = [];
  if (result.stability && !result.stability.stable) flags.push('not shown to be stable');
  const codes = new Set(result.warningCodes);
  if (codes.has('below-physical-minimum') || codes.has('above-physical-maximum'))
    flags.push('values outside physical bounds');
  if (codes.has('no-spread')) flags.push('no spread');
  if (result.model === 'observed' && result.kind === 'measured') flags.push('no distribution model fits');
  return flags;
}
