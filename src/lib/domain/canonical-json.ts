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
  const parts: string[] = [];
  write(value, parts, 0, maxDepth, '');
  return parts.join('');
}

function write(value: unknown, out: string[], depth: number, maxDepth: number, path: string): void {
  if (value === null || typeof value === 'boolean' || typeof value === 'string') {
    out.push(JSON.stringify(value));
    return;
  }
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new RangeError(`${path || 'value'} is not a finite number`);
    out.push(JSON.stringify(value));
    return;
  }
  if (depth >= maxDepth)
    throw new RangeError(`${path || 'value'} is nested more than ${maxDepth} levels deep`);
  if (Array.isArray(value)) {
    out.push('[');
    for (let i = 0; i < value.length; i++) {
      if (i > 0) out.push(',');
      const item: unknown = value[i];
      write(item === undefined ? null : item, out, depth + 1, maxDepth, `${path}[${i}]`);
    }
    out.push(']');
    return;
  }
  if (typeof value === 'object') {
    const obj = value as Record<string, unknown>;
    const keys = Object.keys(obj).sort();
    out.push('{');
    let first = true;
    for (const key of keys) {
      const item = obj[key];
      if (item === undefined) continue;
      if (!first) out.push(',');
      first = false;
      out.push(JSON.stringify(key), ':');
      write(item, out, depth + 1, maxDepth, path ? `${path}.${key}` : key);
    }
    out.push('}');
    return;
  }
  throw new TypeError(`${path || 'value'} cannot be written as JSON (${typeof value})`);
}
