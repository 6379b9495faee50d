/**
 * Version vectors (Parker et al., "Detection of mutual inconsistency in distributed systems", IEEE TSE 1983):
 * for each device, how many writes of this record it has made. Comparing two vectors tells exactly whether
 * one version descends from the other or whether both were edited since they last met — the test the merge
 * needs, independent of anyone's wall clock.
 */
export type VersionVector = Readonly<Record<string, number>>;

/**
 * A device's count in a vector, read as an own property only: a vector is data from a file, and a device named
 * like a member every object inherits (`toString`) must read as 0, never as a function. Vectors built here
 * have no prototype at all.
 */
export function countOf(v: VersionVector, deviceId: string): number {
  return Object.hasOwn(v, deviceId) ? (v[deviceId] as number) : 0;
}

function emptyVector(): Record<string, number> {
  return Object.create(null) as Record<string, number>;
}

export type VersionOrder = 'equal' | 'before' | 'after' | 'concurrent';

/** How `a` relates to `b`: `before` means b has seen every write a has, and more. */
export function compareVersions(a: VersionVector, b: VersionVector): VersionOrder {
  let aAhead = false;
  let bAhead = false;
  for (const device of new Set([...Object.keys(a), ...Object.keys(b)])) {
    const x = countOf(a, device);
    const y = countOf(b, device);
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
  const out = emptyVector();
  for (const device of [...new Set([...Object.keys(a), ...Object.keys(b)])].sort()) {
    out[device] = Math.max(countOf(a, device), countOf(b, device));
  }
  return out;
}

/** The vector after one more write by `deviceId`. */
export function bumpVersion(v: VersionVector, deviceId: string): VersionVector {
  const next = sortedVector(v);
  next[deviceId] = countOf(v, deviceId) + 1;
  return sortedVector(next);
}

/** Total writes the vector accounts for; kept as the record's `rev`. */
export function writeCount(v: VersionVector): number {
  let sum = 0;
  for (const n of Object.values(v)) sum += n;
  return sum;
}

function sortedVector(v: VersionVector): Record<string, number> {
  const out = emptyVector();
  for (const key of Object.keys(v).sort()) out[key] = v[key] as number;
  return out;
}
