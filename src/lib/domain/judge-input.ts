import type { Characteristic } from './characteristic';
import type { Limits } from './specification-history';
import type { WindowFigures } from './window-figures';

/**
 * What judging a characteristic's window needs that does not depend on the context profile, as one object: what a
 * characteristic's row is built from (portfolio-ranking.ts judgePrepared). A ranking keeps the same in columns for
 * every characteristic (window-figure-columns.ts) and builds these only for the rows asked for.
 */
export interface JudgeInput {
  characteristic: Characteristic;
  result: WindowFigures | undefined;
  months: number;
  /** The per-unit figures (perUnitFigures), where the window has a result; as fields, not an object of their own. */
  z: number;
  zBound: number | undefined;
  fraction: number;
  fractionBound: number | undefined;
  /** Limits in force in the window's last month. */
  limits: Limits;
  /** Whether months of the window were left out because the limits changed (WINDOW_RULE). */
  limitsChanged: boolean;
  /** Badges that follow from the figures alone, as bits of ROW_BADGE_ORDER (the profile adds its own). */
  badgeMask: number;
}
