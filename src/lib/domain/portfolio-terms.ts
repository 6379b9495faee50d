import type { MonthlyStatistics } from './monthly-statistics';
import type { WindowFigures } from './window-figures';
import type { WindowFiguresCache } from './window-figures-cache';
import type { Characteristic, RiskClass } from './characteristic';
import type { ContextProfile } from './context-profile';
import type { ImprovementProject } from './improvement-project';
import type { Process } from './process';
import type { Site } from './site';
import type { Study } from './study';

/**
 * The words and shapes of the portfolio ranking — statuses, badges, weights, the rows it returns — apart from
 * its computation (portfolio-ranking.ts), so that a page can name them without loading the capability engine.
 */
export type CharacteristicStatus = 'meets, shown' | 'meets, not shown' | 'short' | 'no recent data';

/** How the status is decided, in the words the pages and the README show. */
export const STATUS_RULE =
  'Short: the estimate misses the required level. Meets, shown: the one-sided confidence bound also meets it and the process shows no sign of instability. Meets, not shown: the estimate meets it, but the bound does not, the data cannot show it, or the control chart shows signals.';

export const STATUS_ORDER: CharacteristicStatus[] = [
  'short',
  'meets, not shown',
  'meets, shown',
  'no recent data'
];

export type Badge =
  | 'non-normal model'
  | 'summary only'
  | 'counted data'
  | 'not shown stable'
  | 'small sample'
  | 'shift convention'
  | 'incomplete'
  | 'limits changed';

export const BADGE_EXPLANATIONS: Record<Badge, string> = {
  'non-normal model':
    'A non-normal model was fitted because the data are not normal; its tails, not a normal curve, give the ppm.',
  'summary only': 'Only n, mean and sd were reported, so normality and stability could not be checked.',
  'counted data': 'The figures come from counts of defects or defectives, not from measurements.',
  'not shown stable': 'The control chart shows signals: the process may not stay where these figures put it.',
  'small sample': 'Fewer than 30 values or 100 units stand behind a figure, so its interval is wide.',
  'shift convention':
    'This context reports short-term levels: 1.5 is added to every long-term z-level, by convention.',
  incomplete:
    'Some characteristics of this process have no data in the window; they are left out of the combined figures.',
  'limits changed':
    'The limits changed within the window: the window is judged on its months under the limits in force in its last month; earlier months keep their own figures against their own limits.'
};

export interface CharacteristicRow {
  characteristic: Characteristic;
  status: CharacteristicStatus;
  /** The window's figures (window-figures.ts); the full analysis of one study is on its process page. */
  result?: WindowFigures;
  /** The estimate in the unit of the ruling measure (index, z-level as reported, or ppm). */
  estimate?: number;
  /** The one-sided confidence bound in the same unit, where one exists. */
  bound?: number;
  /** The required level in the measure's unit (an index, a z-level, or ppm as a maximum). */
  required: number;
  /** The required level as a z-level, as the context reports it (short-term contexts add the shift). */
  requiredZ?: number;
  /** The characteristic's z-level as the context reports it, per unit (what the status was judged on). */
  zShown?: number;
  /** z(estimate) − z(required), both as reported. */
  zGap?: number;
  /** Centring or spread (measured data): the index if centred today, and the sd that would meet the requirement if centred. */
  centring?: { centredIndex: number; sdNow: number; sdNeeded: number; centringMeets: boolean };
  badges: Badge[];
  months: number;
}

export interface ProcessRow {
  process: Process;
  site: Site;
  profile: ContextProfile | undefined;
  characteristics: CharacteristicRow[];
  status: CharacteristicStatus;
  /** Product of the characteristics' yields (independence assumed). */
  yield?: number;
  ppm?: number;
  /** z-level of the combined yield, as the context reports it (shift added for short-term contexts). */
  zLevel?: number;
  /** Whether z-levels of this row are long-term or short-term (the context's reporting). */
  zBasis: 'long-term' | 'short-term';
  weakest?: CharacteristicRow;
  zGap?: number;
  /** The required z-level of the weakest characteristic, as reported: the one definition pages and files show. */
  requiredZ?: number;
  /** Defective units per million if the weakest characteristic reached its required level (one-sided tail). */
  ppmAtTarget?: number;
  /** Yearly cost a project would save by bringing the process to that level (never negative). */
  gainIfMet?: number;
  /** Cost of poor quality per year: (1 − yield) × monthly volume × 12 × cost per defective, in the process currency. */
  costPerYear?: number;
  /** Reported z-level of each month in the trend span (undefined where no data), oldest first; empty when the
   * ranking was asked for no trend (`trendMonths: 0`). */
  trend: (number | undefined)[];
  /** Least-squares slope of the trend, z per month. */
  trendSlope?: number;
  badges: Badge[];
  projects: ImprovementProject[];
  priority: number;
  riskClass: RiskClass;
}

/** What a quarter's headline needs of a process: its status, its cost and whether some characteristic lacks data. */
export interface ProcessStanding {
  process: Process;
  status: CharacteristicStatus;
  costPerYear: number | undefined;
  /** Some characteristics have window figures and some not (the row's 'incomplete' badge). */
  incomplete: boolean;
}

/** A process's monthly trend line as its row shows it (ProcessRow's trend and trendSlope). */
export type ProcessTrend = Pick<ProcessRow, 'trend' | 'trendSlope'>;

export interface RankingWeights {
  gap: number;
  cost: number;
  risk: number;
  confidence: number;
}

export const DEFAULT_WEIGHTS: RankingWeights = { gap: 1, cost: 0.5, risk: 0.5, confidence: 0.5 };

export const PRIORITY_FORMULA =
  'priority = w_gap × shortfall in z + w_cost × log10(1 + cost per year) + w_risk × risk (standard 0, key 1, safety 2) + w_confidence × (1 if meeting is not shown)';

export type RankingOrder = 'priority' | 'gap' | 'cost' | 'risk' | 'confidence';

export interface RankingOptions {
  /** Last month of the window, YYYY-MM. */
  endPeriod: string;
  /** Months in the window: 1, 3, 12 … */
  windowMonths: number;
  /** Months in the trend (12 if not given; 0 for none). */
  trendMonths?: number;
  weights?: RankingWeights;
  order?: RankingOrder;
  cache?: FiguresCache;
}

/** The cache of window figures a ranking may be given (window-figures-cache.ts). */
export type FiguresCache = WindowFiguresCache;

export interface PortfolioRecords {
  sites: readonly Site[];
  processes: readonly Process[];
  characteristics: readonly Characteristic[];
  studies: readonly Study[];
  projects: readonly ImprovementProject[];
  /**
   * The read model of these studies (monthly-statistics.ts) when the caller keeps one up to date; built from
   * `studies` otherwise.
   */
  statistics?: MonthlyStatistics;
}
