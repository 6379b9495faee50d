/**
 * Version vectors (Parker et al., "Detection of mutual inconsistency in distributed systems", IEEE TSE 1983):
 * for each device, how many writes of this record it has made. Comparing two vectors tells exactly whether
 * one version descends from the other or whether both were edited since they last met — the test the merge
 * needs, independent of anyone's wall clock.
 */
export type VersionVector = Readonly<Record<string, number>>;

export type VersionOrder = 'equal' | 'before' | 'after' | 'concurrent';

/** How `a` relates to `b`: `before` means b has seen every write a has, and more. */
export function compareVersions(a: VersionVector, b: VersionVector): VersionOrder {
  let aAhead = false;
  let bAhead = false;
  for (const device of new Set([...Object.keys(a), ...Object.keys(b)])) {
    const x = a[device] ?? 0;
    const y = b[device] ?? 0;
    if (x > y) aAhead = true;
    else if (y > x) bAhead = true;
    if (aAhead && bAhead) return 'concurrent';
  }
  if (aAhead) return 'after';
  if (bAhead) return 'before';
  return 'equal';
}

/** Least vector that has seen both (element-wise maximum), with devices in sorted order for stable output. */
export function joinVersions(a: VersionVector, b: VersionVector): VersionVector {
  const out: Record<string, number> = {};
  for (const device of [...new Set([...Object.keys(a), ...Object.keys(b)])].sort()) {
    out[device] = Math.max(a[device] ?? 0, b[device] ?? 0);
  }
  return out;
}

/** The vector after one more write by `deviceId`. */
export function bumpVersion(v: VersionVector, deviceId: string): VersionVector {
  return sortedVector({ ...v, [deviceId]: (v[deviceId] ?? 0) + 1 });
}

/** Total writes the vector accounts for; kept as the record's `rev`. */
export function writeCount(v: VersionVector): number {
  let sum = 0;
  for (const n of Object.values(v)) sum += n;
  return sum;
}

function sortedVector(v: Record<string, number>): VersionVector {
  const out: Record<string, number> = {};
  for (const key of Object.keys(v).sort()) out[key] = v[key] as number;
  return out;
}
