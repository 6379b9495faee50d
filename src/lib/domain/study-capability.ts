import { analyzeDefectives, analyzeDefects } from '../stats/analyze-counts';
import { analyzeMeasured, type ModelChoice } from '../stats/analyze-measured';
import { analyzeSummary } from '../stats/analyze-summary';
import type { CapabilityResult } from '../stats/capability-result';
import type { Characteristic } from './characteristic';
import { limitsFor } from './specification-history';
import type { StudyFields } from './study';

export interface StudyCapabilityOptions {
  model?: ModelChoice;
  confidence?: number;
  /** For merged summaries: the pooled within-month sd (see window-study.ts). */
  sdWithin?: number;
}

/**
 * The capability figures of one stored study, with the limits in force in its month (specification-history.ts),
 * the target and the physical bounds. One code path for the app, the worker and the command line. Throws
 * RangeError when the data cannot support an analysis (e.g. a measured characteristic without limits, fewer than
 * two values).
 */
export function capabilityOfStudy(
  study: Pick<StudyFields, 'data' | 'period'>,
  characteristic: Pick<
    Characteristic,
    'lsl' | 'usl' | 'target' | 'limitChanges' | 'physicalMin' | 'physicalMax' | 'dataKind'
  >,
  options: StudyCapabilityOptions = {}
): CapabilityResult {
  const spec = limitsFor(characteristic, study.period);
  const confidence = options.confidence !== undefined ? { confidence: options.confidence } : {};
  const data = study.data;
  switch (data.kind) {
    case 'raw':
      return analyzeMeasured(data.values, {
        spec,
        ...(data.subgroups ? { subgroups: data.subgroups } : {}),
        ...(options.model ? { model: options.model } : {}),
        ...(characteristic.physicalMin !== undefined ? { physicalMin: characteristic.physicalMin } : {}),
        ...(characteristic.physicalMax !== undefined ? { physicalMax: characteristic.physicalMax } : {}),
        ...confidence
      });
    case 'summary':
      return analyzeSummary(data.n, data.mean, data.sd, {
        spec,
        ...confidence,
        ...(options.sdWithin !== undefined
          ? {
              sdWithin: options.sdWithin,
              sdWithinLabel: 'within sigma: pooled within-month sd of the merged months'
            }
          : {})
      });
    case 'defectives':
      return analyzeDefectives(data.units, data.defectives, confidence);
    case 'defects':
      return analyzeDefects(data.units, data.defects, data.opportunitiesPerUnit, confidence);
  }
}

/**
 * A study's figures, or why there are none (the analysis's own message, as the process page shows it in the
 * month's row). The one reading of "figures or reason" for the page and the worker that computes them for it.
 */
export function figuresOrReason(
  study: Pick<StudyFields, 'data' | 'period'>,
  characteristic: Parameters<typeof capabilityOfStudy>[1]
): CapabilityResult | string {
  try {
    return capabilityOfStudy(study, characteristic);
  } catch (error) {
    return error instanceof Error ? error.message : String(error);
  }
}
