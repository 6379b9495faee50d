/**
 * Hybrid logical clock (Kulkarni, Demirbas et al., "Logical Physical Clocks and Consistent Snapshots in Globally
 * Distributed Databases", 2014): a time stamp that follows the wall clock when it can but never runs backwards
 * and always exceeds every stamp this device has already seen. A device whose clock is slow or was set back
 * still stamps its edit of a record later than the version it edited, so "newer edit wins" never undoes an
 * edit made on top of another.
 *
 * A stamp is written as fixed-width text, `<wall ms, 13 digits>-<counter, 4 digits>-<device id>`, so that plain
 * string comparison is the clock's total order (ties between devices broken by device id).
 *
 * The clock never runs ahead of its own device's time by more than `CLOCK_TOLERANCE_MS` (time-bounds.ts): a
 * stamp further ahead is refused where files are read, ignored by `observe`, and never followed by `tick`. So a
 * single bad stamp cannot pin a device's edits to a far-future instant, and the 13 digits always suffice.
 */
import { isDeviceId } from './device-id';
import { CLOCK_TOLERANCE_MS } from './time-bounds';

export type ClockStamp = string;

const WALL_DIGITS = 13;
const COUNTER_DIGITS = 4;
const COUNTER_LIMIT = 10 ** COUNTER_DIGITS;
/** What a stamp looks like; parseStamp reads it by position (WALL_DIGITS and COUNTER_DIGITS are 13 and 4). */
export const STAMP_PATTERN = /^(\d{13})-(\d{4})-(.+)$/;

export interface ClockParts {
  wallMs: number;
  counter: number;
  deviceId: string;
}

export function formatStamp({ wallMs, counter, deviceId }: ClockParts): ClockStamp {
  return `${String(wallMs).padStart(WALL_DIGITS, '0')}-${String(counter).padStart(COUNTER_DIGITS, '0')}-${deviceId}`;
}

/**
 * The parts of a stamp, or undefined for text that is not one: what STAMP_PATTERN matches with a device id
 * after it, read by position rather than by the expression — every record of a file is read this way three
 * times, and the expression was a tenth of checking a company's file (the equivalence is a property test).
 */
export function parseStamp(stamp: ClockStamp): ClockParts | undefined {
  if (stamp.length <= WALL_DIGITS + COUNTER_DIGITS + 2) return undefined;
  const counterStart = WALL_DIGITS + 1;
  const idStart = counterStart + COUNTER_DIGITS + 1;
  if (stamp.charCodeAt(WALL_DIGITS) !== DASH || stamp.charCodeAt(idStart - 1) !== DASH) return undefined;
  for (let i = 0; i < idStart - 1; i += 1) {
    if (i === WALL_DIGITS) continue;
    const c = stamp.charCodeAt(i);
    if (c < ZERO || c > NINE) return undefined;
  }
  const deviceId = stamp.slice(idStart);
  if (!isDeviceId(deviceId)) return undefined;
  return {
    wallMs: Number(stamp.slice(0, WALL_DIGITS)),
    counter: Number(stamp.slice(counterStart, idStart - 1)),
    deviceId
  };
}

const DASH = 45;
const ZERO = 48;
const NINE = 57;

/**
 * What bookkeeping reads of a stamp already found to be one (isClockStamp): its wall-clock milliseconds, and
 * whether it names `deviceId` as its writer — read by position, without the strings parseStamp makes of its parts.
 * A company's file carries 76 000 stamps, each checked by the schema first; parsing each again was a fifth of the
 * change-set checks. For a stamp, the same as parseStamp's wallMs and `deviceId ===` (property-tested).
 */
export function checkedStampWallMs(stamp: ClockStamp): number {
  let ms = 0;
  for (let i = 0; i < WALL_DIGITS; i += 1) ms = ms * 10 + (stamp.charCodeAt(i) - ZERO);
  return ms;
}

/** Whether a stamp already found to be one (isClockStamp) names `deviceId` as its writer (see checkedStampWallMs). */
export function checkedStampNames(stamp: ClockStamp, deviceId: string): boolean {
  const idStart = WALL_DIGITS + COUNTER_DIGITS + 2;
  return stamp.length === idStart + deviceId.length && stamp.startsWith(deviceId, idStart);
}

export function isClockStamp(value: unknown): value is ClockStamp {
  return typeof value === 'string' && value.length <= 120 && parseStamp(value) !== undefined;
}

/** The wall-clock milliseconds of a stamp (NaN for text that is not one). */
export function stampWallMs(stamp: ClockStamp): number {
  return parseStamp(stamp)?.wallMs ?? Number.NaN;
}

/** The stamp a record written before clocks existed is given: its update time, counter 0, its writer. */
export function legacyStamp(updatedAt: string, deviceId: string): ClockStamp {
  const ms = Date.parse(updatedAt);
  return formatStamp({ wallMs: Number.isFinite(ms) && ms > 0 ? ms : 0, counter: 0, deviceId });
}

/** Later of two stamps (either may be missing). */
export function laterStamp(a: ClockStamp | undefined, b: ClockStamp | undefined): ClockStamp | undefined {
  if (a === undefined) return b;
  if (b === undefined) return a;
  return a >= b ? a : b;
}

/**
 * The next stamp after `last` (this device's latest, or the stamp of the version being edited) at wall time
 * `nowMs`: the wall clock if it is ahead, otherwise the same wall time with the counter advanced.
 */
export function nextStamp(last: ClockStamp | undefined, nowMs: number, deviceId: string): ClockStamp {
  const parsed = last === undefined ? undefined : parseStamp(last);
  // A stamp beyond this device's time plus the tolerance is not followed (see the module note).
  const prev = parsed && parsed.wallMs <= nowMs + CLOCK_TOLERANCE_MS ? parsed : undefined;
  if (!prev || nowMs > prev.wallMs)
    return formatStamp({ wallMs: Math.max(0, Math.floor(nowMs)), counter: 0, deviceId });
  const counter = prev.counter + 1;
  return counter < COUNTER_LIMIT
    ? formatStamp({ wallMs: prev.wallMs, counter, deviceId })
    : formatStamp({ wallMs: prev.wallMs + 1, counter: 0, deviceId });
}

/**
 * One device's clock. `observe` is called with every stamp that arrives from elsewhere (imports), `tick` for
 * every write; `after` is the stamp of the version a write replaces, so a record's stamps always increase.
 */
export class HybridClock {
  private last: ClockStamp | undefined;

  constructor(
    readonly deviceId: string,
    private readonly wallMs: () => number = () => Date.now(),
    initial?: ClockStamp
  ) {
    this.observe(initial);
  }

  tick(after?: ClockStamp): ClockStamp {
    const now = this.wallMs();
    const usable = after !== undefined && stampWallMs(after) <= now + CLOCK_TOLERANCE_MS ? after : undefined;
    const stamp = nextStamp(laterStamp(this.last, usable), now, this.deviceId);
    this.last = stamp;
    return stamp;
  }

  /** Takes in a stamp seen elsewhere; one further ahead of this device's time than the tolerance is ignored. */
  observe(remote: ClockStamp | undefined): void {
    if (remote === undefined) return;
    const parts = parseStamp(remote);
    if (parts && parts.wallMs <= this.wallMs() + CLOCK_TOLERANCE_MS)
      this.last = laterStamp(this.last, remote);
  }

  get latest(): ClockStamp | undefined {
    return this.last;
  }
}
