import { checkedStampWallMs } from '../domain/hybrid-clock';
import { periodOf } from '../domain/period';
import { KIND_LABEL, RECORD_KINDS, type RecordKind, type RecordsByKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import type { Study } from '../domain/study';
import { liveMonthClashes } from '../domain/study-month';
import { durationWords, isAheadOfClock, timeAheadOfClock } from '../domain/time-bounds';
import { printable } from './exchange-guards';
import type { ExchangeHeader } from './exchange-schema';
import { bookkeepingProblem } from './record-bookkeeping';

/**
 * Checks of a change set that the schema cannot express: each record's bookkeeping against itself, time stamps
 * and months against the reading device's clock, ids unique across kinds, counts as the header says, and at
 * most one live study per characteristic and month. Each returns one line naming the record and the field.
 */

/** Fields of a record a newer Capstan may add are kept, up to this much JSON text per record. */
export const MAX_UNKNOWN_FIELD_BYTES = 64 * 1024;

/** `records.studies[3] (study 0f3e…)`: where a record sits in the file and which one it is. */
export function recordPlace(kind: RecordKind, index: number, id: unknown): string {
  const shownId = typeof id === 'string' ? printable(id.slice(0, 36)) : '?';
  return `records.${kind}[${index}] (${KIND_LABEL[kind]} ${shownId})`;
}

/**
 * Puts back the top-level fields the schema does not know (it drops them): a file from a newer version keeps
 * what that version added, so this device passes it on unchanged. A record whose unknown fields exceed
 * MAX_UNKNOWN_FIELD_BYTES is refused. Returns a problem line, or undefined.
 */
export function restoreUnknownFields(raw: unknown, records: RecordsByKind): string | undefined {
  const rawRecords = (raw as { records?: Record<string, unknown[]> }).records ?? {};
  for (const kind of RECORD_KINDS) {
    const rawList = rawRecords[kind] ?? [];
    const list = records[kind] as unknown as Record<string, unknown>[];
    for (let i = 0; i < list.length; i++) {
      const source = rawList[i] as Record<string, unknown>;
      const target = list[i]!;
      let extra: Record<string, unknown> | undefined;
      // `for … in` over an object JSON.parse made meets its own keys, without a list of them per record.
      for (const key in source) {
        if (key in target) continue;
        (extra ??= {})[key] = source[key];
      }
      if (!extra) continue;
      const size = JSON.stringify(extra).length;
      if (size > MAX_UNKNOWN_FIELD_BYTES) {
        return `${recordPlace(kind, i, target.id)}: fields this version does not know (${Object.keys(extra)
          .slice(0, 3)
          .map((k) => printable(k.slice(0, 40)))
          .join(
            ', '
          )}) hold ${size.toLocaleString('en')} characters, more than the ${MAX_UNKNOWN_FIELD_BYTES.toLocaleString('en')} kept per record`;
      }
      Object.assign(target, extra);
    }
  }
  return undefined;
}

/** Latest month a study may be for: the current month where the clock is furthest ahead (UTC+14). */
export function latestAcceptedPeriod(nowMs: number): string {
  return periodOf(new Date(nowMs + 14 * 3_600_000));
}

const TIME_FIELDS = ['createdAt', 'updatedAt', 'deletedAt'] as const;

/**
 * Whether every id is used once, over all kinds, told without a map of them when each kind lists its records in
 * id order, as every file Capstan writes does (exchange-file.ts): a repeat within a kind then stands next to
 * itself, and one across kinds meets itself in a merge of the ordered lists. False when an id repeats or some
 * kind is not in order — the map then finds the repeat and names it. Hashing the 76 000 ids of a company's file
 * into the map was 20–30 ms of checking it.
 */
export function idsDistinctInOrder(records: RecordsByKind): boolean {
  const lists = RECORD_KINDS.map((kind) => records[kind] as RecordMeta[]).filter((list) => list.length > 0);
  for (const list of lists) {
    for (let i = 1; i < list.length; i++) if (!(list[i - 1]!.id < list[i]!.id)) return false;
  }
  const at = lists.map(() => 0);
  let previous: string | undefined;
  for (;;) {
    let next = -1;
    let nextId = '';
    for (let k = 0; k < lists.length; k++) {
      if (at[k]! >= lists[k]!.length) continue;
      const id = lists[k]![at[k]!]!.id;
      if (next < 0 || id < nextId) {
        next = k;
        nextId = id;
      }
    }
    if (next < 0) return true;
    if (nextId === previous) return false;
    previous = nextId;
    at[next]! += 1;
  }
}

export function changeSetProblem(
  header: ExchangeHeader,
  records: RecordsByKind,
  nowMs: number
): string | undefined {
  const aheadMs = timeAheadOfClock(nowMs);
  const exported = aheadMs(header.exportedAt);
  if (exported !== undefined) {
    return `header.exportedAt: the file was written ${durationWords(exported - nowMs)} ahead of this device's clock by device ${header.exportedBy.deviceId} (${header.exportedAt}) — correct the clock of one of the two devices, then export again`;
  }
  const latestPeriod = latestAcceptedPeriod(nowMs);
  const seen = idsDistinctInOrder(records) ? undefined : new Map<string, RecordKind>();
  for (const kind of RECORD_KINDS) {
    const list = records[kind] as (RecordMeta & { vv: Record<string, number>; clock: string })[];
    for (let i = 0; i < list.length; i++) {
      const r = list[i]!;
      // The record's place is named only when a problem is found (recordPlace): building it for each record was
      // a tenth of these checks' time. Its stamp has passed the schema, so it is read by position.
      const bookkeeping = bookkeepingProblem(r);
      if (bookkeeping) return `${recordPlace(kind, i, r.id)}, ${bookkeeping.field}: ${bookkeeping.message}`;
      const wall = checkedStampWallMs(r.clock);
      if (isAheadOfClock(wall, nowMs)) {
        return `${recordPlace(kind, i, r.id)}, clock: written by device ${r.deviceId} with a clock stamp ${durationWords(wall - nowMs)} ahead of this device's clock (${new Date(Math.min(wall, 8.64e15)).toISOString()} against ${new Date(nowMs).toISOString()}) — one of the two clocks is wrong; correct it, then try again`;
      }
      for (const field of TIME_FIELDS) {
        const value = r[field];
        const ms = value === undefined ? undefined : aheadMs(value);
        if (ms !== undefined) {
          return `${recordPlace(kind, i, r.id)}, ${field}: ${value} is ${durationWords(ms - nowMs)} ahead of this device's clock (written by device ${r.deviceId}) — one of the two clocks is wrong; correct it, then try again`;
        }
      }
      if (kind === 'studies' && (r as unknown as Study).period > latestPeriod) {
        return `${recordPlace(kind, i, r.id)}, period: ${(r as unknown as Study).period} is a month that has not begun yet (written by device ${r.deviceId}); a month is logged once it has started`;
      }
      if (seen) {
        const before = seen.get(r.id);
        if (before !== undefined) {
          return before === kind
            ? `records.${kind}[${i}]: id ${r.id} appears twice among the ${kind}`
            : `records.${kind}[${i}]: id ${r.id} is used by a ${KIND_LABEL[before]} and a ${KIND_LABEL[kind]}`;
        }
        seen.set(r.id, kind);
      }
    }
    if (header.counts[kind] !== list.length) {
      return `header.counts.${kind} says ${header.counts[kind]} but the file holds ${list.length}`;
    }
  }
  const clash = liveMonthClashes(records.studies)[0];
  if (clash) {
    const [a, b] = clash as [Study, Study];
    return `records.studies: two live studies for one characteristic and month (studies ${a.id} and ${b.id}, characteristic ${a.characteristicId}, ${a.period}); a characteristic has one study per month — the file is damaged or was put together by hand`;
  }
  return undefined;
}
