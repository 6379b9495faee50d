import { parseStamp, type ClockParts } from '../domain/hybrid-clock';

/**
 * A validated record's bookkeeping must agree with itself: `rev` is the vector's total, the last writer
 * (`deviceId`) has at least one write in it, and the clock stamp names that writer. A record that disagrees
 * would break the merge's arithmetic, so it is refused rather than repaired. Returns the field and message.
 */
export function bookkeepingProblem(
  r: {
    rev: number;
    deviceId: string;
    vv: Record<string, number>;
    clock: string;
  },
  stamp: ClockParts | undefined = parseStamp(r.clock)
): { field: string; message: string } | undefined {
  let total = 0;
  for (const n of Object.values(r.vv)) total += n;
  if (r.rev !== total)
    return {
      field: 'rev',
      message: `rev ${r.rev} disagrees with the version vector, which counts ${total} writes`
    };
  if (!Object.hasOwn(r.vv, r.deviceId))
    return { field: 'deviceId', message: `the last writer ${r.deviceId} has no write in the version vector` };
  if (stamp?.deviceId !== r.deviceId)
    return {
      field: 'clock',
      message: `the clock stamp names another device than the last writer ${r.deviceId}`
    };
  return undefined;
}
