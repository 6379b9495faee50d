import { SIGMA_SHIFT } from '../stats/sigma-level';
import type { RiskClass } from './characteristic';

/**
 * What an industry context requires of its processes. One measure rules: a minimum capability index (Cpk where a
 * within sigma exists, else Ppk), a minimum z-level, or a maximum ppm; stricter levels apply to key and safety
 * characteristics. Short-term reporting adds the 1.5σ shift to z-levels — once, and only in contexts that ask
 * for it. Customer-specific and regulatory requirements always prevail over these defaults.
 */
export type RulingMeasure = 'index' | 'zLevel' | 'ppm';

export interface ContextProfile {
  id: string;
  label: string;
  measure: RulingMeasure;
  /** Required level per risk class, in the measure's unit (an index, a z-level, or ppm as a maximum). */
  levels: Record<RiskClass, number>;
  /** 'short-term' reports z-levels with the 1.5σ shift added (common Six Sigma practice). */
  reporting: 'long-term' | 'short-term';
  /** Confidence level for "shown to meet": the one-sided bound must meet the level. */
  confidence: number;
  /** Where the default comes from. */
  source: string;
}

/**
 * The shift a context adds to long-term z-levels when it reports short-term levels: the 1.5 of the common Six
 * Sigma convention (stats/sigma-level.ts) in short-term contexts, 0 otherwise. Every figure, chart and file that
 * reports a z-level as a context asks for it goes through this function.
 */
export function shortTermShift(profile: Pick<ContextProfile, 'reporting'> | undefined): number {
  return profile?.reporting === 'short-term' ? SIGMA_SHIFT : 0;
}

/** "long-term" or "short-term": the label every z-level carries where a context's reporting applies. */
export function zBasisOf(profile: Pick<ContextProfile, 'reporting'> | undefined): 'long-term' | 'short-term' {
  return profile?.reporting === 'short-term' ? 'short-term' : 'long-term';
}

/** Whether level `a` asks less than level `b` of the same measure: a lower index or z, a higher ppm. */
export function isLooser(measure: RulingMeasure, a: number, b: number): boolean {
  return measure === 'ppm' ? a > b : a < b;
}

/**
 * Why an edited safety target needs a stated reason: it asks less than the built-in default for safety in this
 * context, or less than the same context asks of standard characteristics. Undefined when it does neither.
 */
export function loweredSafetyTarget(
  edited: Pick<ContextProfile, 'id' | 'measure' | 'levels'>
): { builtIn?: number; standard?: number } | undefined {
  const builtIn = BUILT_IN_PROFILES.find((p) => p.id === edited.id);
  const safety = edited.levels.safety;
  const belowBuiltIn =
    builtIn && builtIn.measure === edited.measure && isLooser(edited.measure, safety, builtIn.levels.safety);
  const belowStandard = isLooser(edited.measure, safety, edited.levels.standard);
  if (!belowBuiltIn && !belowStandard) return undefined;
  return {
    ...(belowBuiltIn ? { builtIn: builtIn.levels.safety } : {}),
    ...(belowStandard ? { standard: edited.levels.standard } : {})
  };
}

export const BUILT_IN_PROFILES: readonly ContextProfile[] = [
  {
    id: 'vehicle-parts',
    label: 'Vehicle parts',
    measure: 'index',
    levels: { standard: 1.33, key: 1.67, safety: 1.67 },
    reporting: 'long-term',
    confidence: 0.95,
    source:
      'Automotive production part approval practice (AIAG PPAP manual): Ppk ≥ 1.67 for initial studies of special characteristics, ≥ 1.33 for ongoing processes — from memory; customer-specific requirements prevail.'
  },
  {
    id: 'aerospace-parts',
    label: 'Aerospace parts',
    measure: 'index',
    levels: { standard: 1.33, key: 1.33, safety: 1.67 },
    reporting: 'long-term',
    confidence: 0.95,
    source:
      'Key-characteristic practice of the aerospace standards (AS9103 family): Cpk ≥ 1.33 — from memory; 1.67 for safety is common practice.'
  },
  {
    id: 'medical-devices',
    label: 'Medical devices',
    measure: 'index',
    levels: { standard: 1.33, key: 1.33, safety: 1.67 },
    reporting: 'long-term',
    confidence: 0.95,
    source:
      'Common practice in process validation (no standard sets a number); from memory. Regulatory and design-risk requirements prevail.'
  },
  {
    id: 'semiconductors',
    label: 'Semiconductors',
    measure: 'index',
    levels: { standard: 1.5, key: 1.67, safety: 2.0 },
    reporting: 'long-term',
    confidence: 0.95,
    source: 'Common practice in wafer fabs (Cpk 1.5 and up for critical steps); from memory.'
  },
  {
    id: 'packaged-goods',
    label: 'Packaged goods, net content',
    measure: 'ppm',
    levels: { standard: 25000, key: 10000, safety: 1000 },
    reporting: 'long-term',
    confidence: 0.95,
    source:
      'Average-quantity rules for prepackages (OIML R 87): at most 2.5 % of packages below the tolerable negative error — from memory; the ppm level stands in for that rule.'
  },
  {
    id: 'transactional-service',
    label: 'Transactional and service work',
    measure: 'zLevel',
    levels: { standard: 3.0, key: 3.5, safety: 4.5 },
    reporting: 'short-term',
    confidence: 0.95,
    source:
      'Common practice in service Six Sigma programmes (sigma level 3 and up, reported with the 1.5σ shift); from memory.'
  }
];

export function profileFor(
  profiles: readonly ContextProfile[],
  contextId: string
): ContextProfile | undefined {
  return profiles.find((p) => p.id === contextId);
}
