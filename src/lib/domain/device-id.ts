/**
 * A device id as it appears in records, version vectors and clock stamps: lower-case letters, digits and
 * hyphens, 1–80 characters, starting with a letter or digit (a UUID, or a short name in tests and tools).
 * Names that an ordinary object already carries (`constructor`, `valueOf`, …) are refused too: vectors are
 * held in prototype-free maps, but a file must not be able to name a device after a member of every object.
 */
const DEVICE_ID = /^[a-z0-9][a-z0-9-]{0,79}$/;
const OBJECT_MEMBERS = new Set(Object.getOwnPropertyNames(Object.prototype));

/**
 * The last id found to be one: a file's records name their few writers over and over (four times a record), and
 * comparing with the last is a fraction of the expression's cost.
 */
let lastDeviceId: string | undefined;

export function isDeviceId(value: unknown): value is string {
  if (value === lastDeviceId) return true;
  if (typeof value !== 'string' || !DEVICE_ID.test(value) || OBJECT_MEMBERS.has(value)) return false;
  lastDeviceId = value;
  return true;
}

export const DEVICE_ID_RULE =
  'a device id is 1–80 lower-case letters, digits or hyphens (as a UUID), and not the name of a built-in member';
