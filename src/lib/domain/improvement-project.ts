import type { RecordMeta } from './record-meta';

/** The DMAIC phases, in order. */
export const PROJECT_PHASES = ['Define', 'Measure', 'Analyze', 'Improve', 'Control'] as const;
export type ProjectPhase = (typeof PROJECT_PHASES)[number];

/** Where a project stands: running, closed with its result, or cancelled (both with a reason). */
export const PROJECT_STATES = ['open', 'closed', 'cancelled'] as const;
export type ProjectState = (typeof PROJECT_STATES)[number];

/** An improvement project aimed at one process. */
export interface ImprovementProjectFields {
  processId: string;
  title: string;
  phase: ProjectPhase;
  owner: string;
  /** Calendar dates written YYYY-MM-DD. */
  startDate: string;
  targetDate?: string;
  /** Expected saving per year once the project holds its gain, in the process's currency. */
  expectedAnnualSaving: number;
  /** The day each phase was entered (YYYY-MM-DD). */
  phaseDates?: Partial<Record<ProjectPhase, string>>;
  /** The level the project aims at, in the context's ruling measure (an index, a z-level or ppm). */
  targetLevel?: number;
  /** Absent or 'open' while it runs; closed or cancelled with a reason. */
  state?: ProjectState;
  stateReason?: string;
  /** In the Control phase or at closing: the result achieved, in words and as a level. */
  achieved?: { level?: number; note: string };
  /** What changed, when and by whom, newest last (kept with the record, so it travels). */
  history?: { at: string; by: string; change: string }[];
}
export type ImprovementProject = ImprovementProjectFields & RecordMeta;

/** Running: neither closed nor cancelled. Pipelines and badges count these only. */
export function isOpen(p: Pick<ImprovementProjectFields, 'state'>): boolean {
  return p.state === undefined || p.state === 'open';
}

/**
 * Lines saying what changed between two versions of a project, for its history: the phase, the state, dates,
 * target level, saving, result and owner, in words.
 */
export function projectChanges(before: ImprovementProjectFields, after: ImprovementProjectFields): string[] {
  const out: string[] = [];
  if (before.phase !== after.phase) out.push(`phase ${before.phase} → ${after.phase}`);
  if ((before.state ?? 'open') !== (after.state ?? 'open'))
    out.push(`${after.state ?? 'open'}${after.stateReason ? `: ${after.stateReason}` : ''}`);
  if (before.title !== after.title) out.push(`title “${after.title}”`);
  if (before.owner !== after.owner) out.push(`owner ${after.owner || '–'}`);
  if (before.targetDate !== after.targetDate) out.push(`target date ${after.targetDate ?? '–'}`);
  if (before.targetLevel !== after.targetLevel) out.push(`target level ${after.targetLevel ?? '–'}`);
  if (before.expectedAnnualSaving !== after.expectedAnnualSaving)
    out.push(`expected saving ${after.expectedAnnualSaving}`);
  if (JSON.stringify(before.achieved) !== JSON.stringify(after.achieved))
    out.push(`result: ${after.achieved?.note ?? '–'}`);
  return out;
}
