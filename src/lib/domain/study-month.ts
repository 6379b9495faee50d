import { compareEdits } from './edit-order';
import { isLive } from './record-meta';
import type { Study } from './study';

/**
 * One live study per characteristic and month: the key every part of Capstan uses for that rule (saving,
 * importing, merging, checking files, upgrading a database). A month logged on two devices is two studies with
 * this key — a conflict a person settles, never two studies pooled.
 */
export function studyMonthKey(study: Pick<Study, 'characteristicId' | 'period'>): string {
  return `${study.characteristicId}|${study.period}`;
}

/** The characteristic a studyMonthKey names. */
export function characteristicOfMonthKey(key: string): string {
  return key.slice(0, key.lastIndexOf('|'));
}

/** Groups of two or more live studies that share a characteristic and month, each group in id order. */
export function liveMonthClashes<T extends Study>(studies: Iterable<T>): T[][] {
  const byKey = new Map<string, T[]>();
  for (const s of studies) {
    if (!isLive(s)) continue;
    const key = studyMonthKey(s);
    const list = byKey.get(key);
    if (list) list.push(s);
    else byKey.set(key, [s]);
  }
  const out: T[][] = [];
  for (const list of byKey.values()) {
    if (list.length > 1) out.push(list.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)));
  }
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
