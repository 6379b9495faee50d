import type { LimitChange } from './specification-history';
import type { RecordMeta } from './record-meta';

export const DATA_KINDS = ['measured', 'counted'] as const;
export type DataKind = (typeof DATA_KINDS)[number];

/** How much depends on the characteristic: key and safety characteristics are held to stricter targets. */
export const RISK_CLASSES = ['standard', 'key', 'safety'] as const;
export type RiskClass = (typeof RISK_CLASSES)[number];

/** What a counted characteristic counts: units found defective, or defects (several may sit on one unit). */
export const COUNTED_AS = ['defectives', 'defects'] as const;
export type CountedAs = (typeof COUNTED_AS)[number];

/** One property of a process output that is checked against a specification. */
export interface CharacteristicFields {
  processId: string;
  name: string;
  unit: string;
  dataKind: DataKind;
  /** The first limits (before any change in `limitChanges`, see specification-history.ts). */
  lsl?: number;
  usl?: number;
  target?: number;
  /** Later limits, each from a month: earlier months keep the limits they were judged against. */
  limitChanges?: LimitChange[];
  riskClass: RiskClass;
  /** Physical bounds of the quantity (e.g. 0 for a length or a fill weight); values outside are flagged. */
  physicalMin?: number;
  physicalMax?: number;
  /** Usual subgroup size of the measurements (for control charts and the within sigma), 2 to 100. */
  subgroupSize?: number;
  /** For counted data: what is counted, and how many chances of a defect one unit offers. */
  countedAs?: CountedAs;
  opportunitiesPerUnit?: number;
  /** Set while the characteristic is archived: it keeps its history but leaves the ranking and the review. */
  archivedAt?: string;
}
export type Characteristic = CharacteristicFields & RecordMeta;
