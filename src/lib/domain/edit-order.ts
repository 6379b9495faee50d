import { parseStamp } from './hybrid-clock';
import { clockOf, type RecordMeta } from './record-meta';

/**
 * Order of two edits for "newer edit wins", in terms a person can follow from what the preview shows: the later
 * edit time (the wall time of the hybrid-clock stamp, which never lies behind an edit the device had seen),
 * then — for edits stamped in the same millisecond — the one that had seen more edits of the record (higher
 * revision), then the device id, only so that both devices decide alike. Positive when `a` is newer.
 */
export function compareEdits(a: RecordMeta, b: RecordMeta): number {
  const x = parseStamp(clockOf(a));
  const y = parseStamp(clockOf(b));
  const wall = (x?.wallMs ?? 0) - (y?.wallMs ?? 0);
  if (wall !== 0) return wall;
  const counter = (x?.counter ?? 0) - (y?.counter ?? 0);
  if (counter !== 0) return counter;
  const rev = a.rev - b.rev;
  if (rev !== 0) return rev;
  return a.deviceId < b.deviceId ? 1 : a.deviceId > b.deviceId ? -1 : 0;
}

/** The edit time people see for a version: the wall time of its clock stamp, as ISO 8601. */
export function editTimeOf(record: RecordMeta): string {
  const ms = parseStamp(clockOf(record))?.wallMs;
  return ms === undefined ? record.updatedAt : new Date(ms).toISOString();
}

/** Why `newerOf` chose as it did, in words for the preview ("edited later", "same time: more edits behind it"). */
export function newerReason(a: RecordMeta, b: RecordMeta): string {
  const x = parseStamp(clockOf(a));
  const y = parseStamp(clockOf(b));
  if ((x?.wallMs ?? 0) !== (y?.wallMs ?? 0)) return 'edited later';
  if ((x?.counter ?? 0) !== (y?.counter ?? 0)) return 'same time, but made after seeing the other edit';
  if (a.rev !== b.rev) return 'same time; the version with more edits behind it';
  return 'same time and history; the lower device id, by convention';
}
