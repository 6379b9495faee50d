import type { Characteristic } from './characteristic';
import type { Limits } from './specification-history';
import type { WindowFigures } from './window-figures';

/**
 * What judging a characteristic's window needs that does not depend on the context profile: computed once per
 * window (portfolio-ranking.ts), so that a change of target, weight or order only compares; and kept as it is by
 * the window figures cache (window-figures-cache.ts), which finds it by the window key it carries. One object per
 * characteristic and window: at company size every object kept per window counts (a separate cache entry and an
 * array of cell stamps per window were a sixth of a first ranking, most of it collecting them).
 */
export interface JudgeInput extends WindowKey {
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

/**
 * What a window was computed from: the characteristic's revision, the window's first and last months
 * (portfolio-index monthOrdinal) and the stamp of its row in the read model when computed (MonthlyStatistics
 * rowStamp). NaN for a window judged outside a cache.
 */
export interface WindowKey {
  rev: number;
  first: number;
  end: number;
  rowStamp: number;
}
