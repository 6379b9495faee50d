import { compareEdits } from './edit-order';
import { compareById, isLive } from './record-meta';
import type { Study } from './study';

/**
 * One live study per characteristic and month: the key every part of Capstan uses for that rule (saving,
 * importing, merging, checking files, upgrading a database). A month logged on two devices is two studies with
 * this key — a conflict a person settles, never two studies pooled.
 */
export function studyMonthKey(study: Pick<Study, 'characteristicId' | 'period'>): string {
  return `${study.characteristicId}|${study.period}`;
}

/**
 * A set of characteristic-months (the pairs studyMonthKey names), held as its two parts, characteristic then
 * month: checking a company's 72 000 studies against a set of key strings built a string for each, twice.
 */
export class StudyMonthSet {
  readonly #months = new Map<string, Set<string>>();

  has(study: Pick<Study, 'characteristicId' | 'period'>): boolean {
    return this.#months.get(study.characteristicId)?.has(study.period) ?? false;
  }

  add(study: Pick<Study, 'characteristicId' | 'period'>): this {
    let months = this.#months.get(study.characteristicId);
    if (!months) this.#months.set(study.characteristicId, (months = new Set()));
    months.add(study.period);
    return this;
  }
}

/** The characteristic a studyMonthKey names. */
export function characteristicOfMonthKey(key: string): string {
  return key.slice(0, key.lastIndexOf('|'));
}

/**
 * Groups of two or more live studies that share a characteristic and month (studyMonthKey), each group in id
 * order, the groups in the order their first study came. The key is held as its two parts, characteristic then
 * month, and a month keeps its one study until a second comes: a key string and a list per study were most of
 * what checking a company's file for clashes cost (126 ms for 72 000 studies, cold).
 */
export function liveMonthClashes<T extends Study>(studies: Iterable<T>): T[][] {
  // The studies, and the groups they started, in the order their months were first met.
  const slots: (T | T[])[] = [];
  const byCharacteristic = new Map<string, Map<string, number>>();
  for (const s of studies) {
    if (!isLive(s)) continue;
    let months = byCharacteristic.get(s.characteristicId);
    if (!months) byCharacteristic.set(s.characteristicId, (months = new Map()));
    const at = months.get(s.period);
    if (at === undefined) {
      months.set(s.period, slots.length);
      slots.push(s);
      continue;
    }
    const held = slots[at]!;
    if (Array.isArray(held)) held.push(s);
    else slots[at] = [held, s];
  }
  const out: T[][] = [];
  for (const slot of slots) if (Array.isArray(slot)) out.push(slot.sort(compareById));
  return out;
}

/**
 * Live studies with at most one per characteristic and month: where a month still holds two (a pending conflict
 * from before one study per month was enforced), the more recently edited one stands in until a person settles
 * it. Figures never pool two studies of one month.
 */
export function onePerMonth<T extends Study>(studies: readonly T[]): T[] {
  const byKey = new Map<string, T>();
  let clash = false;
  for (const s of studies) {
    if (!isLive(s)) continue;
    const key = studyMonthKey(s);
    const other = byKey.get(key);
    if (other === undefined) byKey.set(key, s);
    else {
      clash = true;
      if (compareEdits(s, other) > 0 || (compareEdits(s, other) === 0 && s.id < other.id)) byKey.set(key, s);
    }
  }
  return clash ? [...byKey.values()] : studies.filter(isLive);
}
