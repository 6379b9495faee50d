/**
 * Canonical JSON: object keys in code-unit order, no white space, numbers and strings as JSON.stringify writes
 * them (shortest round-trip form, RFC 8259 escapes). Two equal values always give the same text, which is what
 * content hashes and "is this the same record?" need. Follows the spirit of RFC 8785 (JCS); key order by UTF-16
 * code units is exactly JCS's, number formatting is ECMAScript's, as in JCS.
 *
 * Keys whose value is `undefined` are left out, as JSON.stringify does. Throws a RangeError naming the path when
 * the value nests deeper than `maxDepth`, so a hostile file cannot exhaust the stack.
 */
export function canonicalJson(value: unknown, maxDepth = 64): string {
  try {
    // Fast path: a copy with every object's keys inserted in sorted order, written by JSON.stringify. Same text
    // (JSON.stringify follows insertion order, writes numbers and strings the same way and leaves out undefined
    // keys), about ten times faster on a company's file than joining the pieces here. Objects with array-index
    // keys ("0", "12") cannot be reordered that way (the engine lists those first, by value): they take `write`.
    try {
      return JSON.stringify(sortedCopy(value, 0, maxDepth));
    } catch (error) {
      if (error !== INDEX_KEYS) throw error;
    }
    return write(value, 0, maxDepth);
  } catch (error) {
    // Paths are only worked out when something is wrong: building them for every value costs more than the rest.
    const path = problemPath(value, 0, maxDepth, '');
    if (error instanceof RangeError && path !== undefined)
      throw new RangeError(`${path.path} ${path.what}`, { cause: error });
    throw error;
  }
}

function problemPath(
  value: unknown,
  depth: number,
  maxDepth: number,
  path: string
): { path: string; what: string } | undefined {
  const here = path || 'value';
  if (typeof value === 'number')
    return Number.isFinite(value) ? undefined : { path: here, what: 'is not a finite number' };
  if (value === null || typeof value !== 'object') return undefined;
  if (depth >= maxDepth) return { path: here, what: `is nested more than ${maxDepth} levels deep` };
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = problemPath(value[i], depth + 1, maxDepth, `${path}[${i}]`);
      if (found) return found;
    }
    return undefined;
  }
  for (const key of Object.keys(value).sort()) {
    const found = problemPath(
      (value as Record<string, unknown>)[key],
      depth + 1,
      maxDepth,
      path ? `${path}.${key}` : key
    );
    if (found) return found;
  }
  return undefined;
}

/** The same text built piece by piece, for every value: the reference the fast path is tested against. */
export function canonicalJsonPiecewise(value: unknown, maxDepth = 64): string {
  return write(value, 0, maxDepth);
}

/** Thrown by `sortedCopy` when an object has array-index keys, which only `write` can order. */
const INDEX_KEYS = Symbol('array-index keys');
const ARRAY_INDEX = /^(?:0|[1-9]\d*)$/;

function sortedCopy(value: unknown, depth: number, maxDepth: number): unknown {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new RangeError('value is not a finite number');
    return value;
  }
  if (value === null || typeof value === 'string' || typeof value === 'boolean') return value;
  if (typeof value !== 'object') throw new TypeError(`a value cannot be written as JSON (${typeof value})`);
  if (depth >= maxDepth) throw new RangeError(`value is nested more than ${maxDepth} levels deep`);
  if (Array.isArray(value)) {
    let copy: unknown[] | undefined;
    for (let i = 0; i < value.length; i++) {
      const item: unknown = value[i];
      const out = item === undefined ? null : sortedCopy(item, depth + 1, maxDepth);
      if (copy === undefined && out !== item) copy = value.slice(0, i);
      if (copy !== undefined) copy.push(out);
    }
    return copy ?? value;
  }
  const obj = value as Record<string, unknown>;
  const order = keyOrderOf(Object.keys(obj));
  // An ordinary object, whose keys added in the same order share one layout (written faster by JSON.stringify);
  // without a prototype only when a key is named __proto__, so that it stays an ordinary key, as JSON.parse made it.
  const copy: Record<string, unknown> = order.protoKey
    ? (Object.create(null) as Record<string, unknown>)
    : {};
  for (const key of order.sorted) {
    const item = obj[key];
    if (item !== undefined) copy[key] = sortedCopy(item, depth + 1, maxDepth);
  }
  return copy;
}

interface KeyOrder {
  /** The keys as Object.keys lists them. */
  keys: string[];
  sorted: string[];
  protoKey: boolean;
}

/**
 * The key orders met last. The records of a file repeat a handful of key lists, each in the same order (a
 * study's, its data's, its version vector's): a list met before is recognised by comparing its keys one by one
 * (property names are interned, so most comparisons are of two references) instead of being sorted and checked
 * for array-index keys again, which was most of the time spent writing a company's file.
 */
const keyOrders: KeyOrder[] = [];
const KEY_ORDERS_KEPT = 16;

function keyOrderOf(keys: string[]): KeyOrder {
  next: for (const order of keyOrders) {
    if (order.keys.length !== keys.length) continue;
    for (let i = 0; i < keys.length; i++) if (order.keys[i] !== keys[i]) continue next;
    return order;
  }
  for (const key of keys) if (ARRAY_INDEX.test(key) && Number(key) < 4294967295) throw INDEX_KEYS;
  const order: KeyOrder = { keys, sorted: [...keys].sort(), protoKey: keys.includes('__proto__') };
  if (keyOrders.length >= KEY_ORDERS_KEPT) keyOrders.pop();
  keyOrders.unshift(order);
  return order;
}

/** Keys are few and repeat in every record: their quoted form is computed once. */
const quotedKeys = new Map<string, string>();
function quoted(key: string): string {
  let q = quotedKeys.get(key);
  if (q === undefined) {
    q = JSON.stringify(key);
    if (quotedKeys.size < 10_000) quotedKeys.set(key, q);
  }
  return q;
}

function write(value: unknown, depth: number, maxDepth: number): string {
  if (value === null || typeof value === 'boolean' || typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new RangeError('value is not a finite number');
    return JSON.stringify(value);
  }
  if (depth >= maxDepth) throw new RangeError(`value is nested more than ${maxDepth} levels deep`);
  if (Array.isArray(value)) {
    // Measurement lists are most of a file: a list of finite numbers is written by the engine in one call.
    let numbers = true;
    for (let i = 0; i < value.length; i++) {
      const v: unknown = value[i];
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        numbers = false;
        break;
      }
    }
    if (numbers) return JSON.stringify(value);
    let out = '[';
    for (let i = 0; i < value.length; i++) {
      if (i > 0) out += ',';
      const item: unknown = value[i];
      out += write(item === undefined ? null : item, depth + 1, maxDepth);
    }
    return out + ']';
  }
  if (typeof value === 'object') {
    const obj = value as Record<string, unknown>;
    const keys = Object.keys(obj).sort();
    let out = '{';
    let first = true;
    for (const key of keys) {
      const item = obj[key];
      if (item === undefined) continue;
      if (!first) out += ',';
      first = false;
      out += quoted(key) + ':' + write(item, depth + 1, maxDepth);
    }
    return out + '}';
  }
  throw new TypeError(`a value cannot be written as JSON (${typeof value})`);
}
