import { checkedStampNames } from '../domain/hybrid-clock';

/**
 * A validated record's bookkeeping must agree with itself: `rev` is the vector's total, the last writer
 * (`deviceId`) has at least one write in it, and the clock stamp names that writer. A record that disagrees
 * would break the merge's arithmetic, so it is refused rather than repaired. Returns the field and message. The
 * record has passed the schema, so its clock is a stamp (checkedStampNames).
 */
export function bookkeepingProblem(r: {
  rev: number;
  deviceId: string;
  vv: Record<string, number>;
  clock: string;
}): { field: string; message: string } | undefined {
  let total = 0;
  // No list of the vector's counts per record (a company's file has 76 000 records).
  for (const device in r.vv) total += r.vv[device]!;
  if (r.rev !== total)
    return {
      field: 'rev',
      message: `rev ${r.rev} disagrees with the version vector, which counts ${total} writes`
    };
  if (!Object.hasOwn(r.vv, r.deviceId))
    return { field: 'deviceId', message: `the last writer ${r.deviceId} has no write in the version vector` };
  if (!checkedStampNames(r.clock, r.deviceId))
    return {
      field: 'clock',
      message: `the clock stamp names another device than the last writer ${r.deviceId}`
    };
  return undefined;
}
