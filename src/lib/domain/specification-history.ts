import type { Period } from './period';

/**
 * Specification limits change in real plants, and a change must not rewrite the past. A characteristic holds
 * its first limits (`lsl`, `target`, `usl`) and the changes since, each taking effect from a month. A study is
 * judged against the limits in force in its own month.
 *
 * WINDOW_RULE says how a window of months that spans a change is judged.
 */
export interface Limits {
  lsl?: number;
  target?: number;
  usl?: number;
}

export interface LimitChange extends Limits {
  /** First month these limits apply to. */
  from: Period;
  /** Why the limits changed (drawing revision, customer request). */
  reason?: string;
}

export interface WithLimitHistory extends Limits {
  limitChanges?: readonly LimitChange[];
}

export const WINDOW_RULE =
  'A window that spans a change of limits is judged on its months under the limits in force in its last month; earlier months, under other limits, are left out of the window figures (each month keeps its own figures, against its own limits).';

/** The change in force in a month, or undefined when the first limits still apply. */
export function changeInForce(c: WithLimitHistory, period: Period): LimitChange | undefined {
  let found: LimitChange | undefined;
  for (const change of c.limitChanges ?? [])
    if (change.from <= period && (!found || change.from > found.from)) found = change;
  return found;
}

/** The limits in force in a month. */
export function limitsFor(c: WithLimitHistory, period: Period): Limits {
  const change = changeInForce(c, period);
  const l = change ?? c;
  // Field by field rather than by spreads: asked for every month of every window of a portfolio.
  const out: Limits = {};
  if (l.lsl !== undefined) out.lsl = l.lsl;
  if (l.target !== undefined) out.target = l.target;
  if (l.usl !== undefined) out.usl = l.usl;
  return out;
}

/** A key naming the limits in force in a month ('first' or the month a change took effect). */
export function limitVersionOf(c: WithLimitHistory, period: Period): string {
  return changeInForce(c, period)?.from ?? 'first';
}

/** The limits in force now or at the latest month given: what a form shows as "the current limits". */
export function currentLimits(c: WithLimitHistory, period: Period): Limits {
  return limitsFor(c, period);
}

/**
 * The history with a new change from a month: a change already taking effect that month is replaced; the list
 * stays in month order.
 */
export function withLimitChange(c: WithLimitHistory, change: LimitChange): LimitChange[] {
  return [...(c.limitChanges ?? []).filter((x) => x.from !== change.from), change].sort((a, b) =>
    a.from < b.from ? -1 : a.from > b.from ? 1 : 0
  );
}

/** Every set of limits the characteristic has had, oldest first: the first limits, then each change. */
export function limitVersions(c: WithLimitHistory): { from?: Period; limits: Limits; reason?: string }[] {
  const first = limitsFor({ lsl: c.lsl, target: c.target, usl: c.usl }, '0000-01');
  return [
    { limits: first },
    ...[...(c.limitChanges ?? [])]
      .sort((a, b) => (a.from < b.from ? -1 : a.from > b.from ? 1 : 0))
      .map((x) => ({
        from: x.from,
        limits: limitsFor({ lsl: x.lsl, target: x.target, usl: x.usl }, '0000-01'),
        ...(x.reason ? { reason: x.reason } : {})
      }))
  ];
}
