/**
 * Checks run on an exchange file before schema validation, so that a hostile or damaged file is refused quickly
 * and with a message that says where: nesting depth, keys that could reach an object's prototype when copied
 * (`__proto__`, `constructor`, `prototype`), list lengths, and a key written twice in one object (JSON.parse
 * would silently keep the last one, so two readers could see two different files).
 *
 * Text is not screened for markup: no filter can recognise every way of writing it, so Capstan instead never
 * renders stored text as markup (pages interpolate it as text, charts draw it as text) and neutralises
 * formula-like cells in the CSV files it writes (exchange/spreadsheet-csv.ts).
 */
/**
 * Largest file (and, for a compressed file, largest unpacked text) Capstan reads: 512 MiB. A company of 20 000
 * characteristics × 36 months writes some 290 MB, and a shared folder's files each hold everything a device has
 * (folder-sync.ts): such a file was received, checked and merged in Chromium (`npm run bench`, the 20 000-process
 * browser rows). The bound keeps a compressed file from unpacking without end.
 */
export const MAX_EXCHANGE_BYTES = 512 * 1024 * 1024;

/** A size as the messages about sizes give it. */
export const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** Why a file of `bytes` bytes is refused before a byte of it is read, or undefined when its size is fine. */
export function sizeProblem(bytes: number): string | undefined {
  if (bytes === 0) return 'The file is empty (0 bytes): nothing to import';
  if (bytes > MAX_EXCHANGE_BYTES) {
    return `The file is ${mb(bytes)}; Capstan reads exchange files up to ${mb(MAX_EXCHANGE_BYTES)} — export per site or as changes since the last file instead`;
  }
  return undefined;
}

export const MAX_NESTING = 16;
/** Records per kind; a file holding more is refused before validation so that it cannot exhaust memory. */
export const MAX_RECORDS_PER_KIND = 1_000_000;
export const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/**
 * Text from a file made safe to print in a message or on a terminal: control characters (C0, DEL, C1) and the
 * invisible direction overrides become visible escapes such as `\u001b`, so a file cannot move the cursor,
 * recolour a terminal or reorder what a person reads.
 */
export function printable(text: string): string {
  return text.replace(
    // eslint-disable-next-line no-control-regex
    /[\u0000-\u001f\u007f-\u009f\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g,
    (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`
  );
}

interface OpenContainer {
  /** Keys seen so far (objects), or undefined for a list. */
  keys: Set<string> | undefined;
  /** The key or list index under which this container sits in its parent. */
  at: string | number;
  /** For a list: the index of the element being read. */
  index: number;
}

function containerPath(stack: readonly OpenContainer[], key: string): string {
  const parts: (string | number)[] = [];
  for (let i = 1; i < stack.length; i++) parts.push(stack[i]!.at);
  parts.push(key);
  return pathText(parts);
}

/** End of the string that opens at `i` (the index of its closing quote), or -1. */
function stringEnd(text: string, i: number): number {
  let j = text.indexOf('"', i + 1);
  for (;;) {
    if (j < 0) return -1;
    let slashes = 0;
    while (text.charCodeAt(j - 1 - slashes) === 92) slashes++;
    if (slashes % 2 === 0) return j;
    j = text.indexOf('"', j + 1);
  }
}

/**
 * How many keys the JSON text writes: strings followed by a colon (a value string never is). Scanning the text
 * with indexOf took 44 ms on a 30 MB file, the same scan of its UTF-8 bytes 77 ms (Node 20).
 */
export function keysWritten(text: string): number {
  let keys = 0;
  for (let i = text.indexOf('"'); i >= 0; i = text.indexOf('"', i + 1)) {
    const j = stringEnd(text, i);
    if (j < 0) break;
    let k = j + 1;
    let c = text.charCodeAt(k);
    while (c === 32 || c === 10 || c === 13 || c === 9) c = text.charCodeAt(++k);
    if (c === 58) keys++;
    i = j;
  }
  return keys;
}

/**
 * The first key that appears twice in one object of the JSON text, as `path: message`, or undefined. Call it on
 * text that JSON.parse accepted. Given how many keys the parsed value holds (`keysHeld`, from walkStructure), it
 * first compares that with how many keys the text writes — JSON.parse keeps one of each repeated key, so they
 * differ exactly when a key is repeated — and looks for the place only then: counting allocates nothing, and took
 * a company's file from 0.1 s to 0.04 s. (A count cut short by a structural problem is smaller still: the search
 * then decides.) `keysInText`: that count, when it was made already (written-file-facts.ts). The search is one
 * pass over the characters; strings are skipped with indexOf.
 */
export function duplicateKeyProblem(
  text: string,
  keysHeld?: number,
  keysInText?: number
): string | undefined {
  if (keysHeld !== undefined && (keysInText ?? keysWritten(text)) === keysHeld) return undefined;
  const stack: OpenContainer[] = [];
  const n = text.length;
  let expectKey = false;
  let pendingKey: string | number = '';
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === 34) {
      const j = stringEnd(text, i);
      if (j < 0) return undefined;
      const top = stack[stack.length - 1];
      if (expectKey && top?.keys) {
        const raw = text.slice(i + 1, j);
        const key = raw.includes('\\') ? (JSON.parse(text.slice(i, j + 1)) as string) : raw;
        if (top.keys.has(key)) {
          return `${containerPath(stack, key)}: the key "${printable(key.slice(0, 60))}" appears twice in one object; a file Capstan wrote never does — it was edited or damaged`;
        }
        top.keys.add(key);
        pendingKey = key;
        expectKey = false;
      }
      i = j;
      continue;
    }
    if (c === 123 || c === 91) {
      const top = stack[stack.length - 1];
      const at = top === undefined ? '' : top.keys ? pendingKey : top.index;
      stack.push({ keys: c === 123 ? new Set() : undefined, at, index: 0 });
      expectKey = c === 123;
    } else if (c === 125 || c === 93) {
      stack.pop();
    } else if (c === 44) {
      const top = stack[stack.length - 1];
      if (top?.keys) expectKey = true;
      else if (top) top.index++;
    }
  }
  return undefined;
}

export function pathText(path: readonly (string | number)[]): string {
  let out = '';
  for (const part of path) out += typeof part === 'number' ? `[${part}]` : out === '' ? part : `.${part}`;
  return out || 'top level of the file';
}

/** A node of the walk: its value and how to name its path if a problem is found there (built only then). */
interface Node {
  value: unknown;
  parent: Node | undefined;
  key: string | number;
  depth: number;
}

function pathOf(node: Node): string {
  const parts: (string | number)[] = [];
  for (let n: Node | undefined = node; n && n.parent; n = n.parent) parts.push(n.key);
  return pathText(parts.reverse());
}

const isNumberList = (key: string | number) => key === 'values' || key === 'subgroups';

/** First structural problem of a parsed value, or undefined. */
export function structuralProblem(root: unknown, maxArray: number): string | undefined {
  return walkStructure(root, maxArray).problem;
}

/**
 * One walk of a parsed value: its first structural problem (or undefined), and how many keys its objects hold
 * (counted up to that problem) for duplicateKeyProblem — one walk where a reading made two. A file that passes
 * is walked once, by quickWalk; only a file with a problem is walked again, step by step, to name where it lies.
 */
export function walkStructure(
  root: unknown,
  maxArray: number
): { problem: string | undefined; keys: number } {
  const keys = quickWalk(root, maxArray);
  return keys === undefined ? walkNamingProblems(root, maxArray) : { problem: undefined, keys };
}

/** `__proto__` and `prototype` have 9 characters, `constructor` 11: most keys are let through by length. */
const mayBeForbidden = (key: string) => (key.length === 9 || key.length === 11) && FORBIDDEN_KEYS.has(key);

/**
 * The keys a parsed value's objects hold, or undefined when it has any of the problems walkNamingProblems
 * names. It keeps no path and makes no list of each object's keys: on a company's file (1.2 million keys) those
 * made the walk 50 ms and added to every garbage collection after it. Iterative, so depth cannot overflow the
 * stack. Values are objects JSON.parse made, so `for … in` meets exactly their own keys.
 */
function quickWalk(root: unknown, maxArray: number): number | undefined {
  if (root === null || typeof root !== 'object') return 0;
  const open: object[] = [root];
  const depths: number[] = [0];
  let keys = 0;
  while (open.length > 0) {
    const value = open.pop()!;
    const depth = depths.pop()!;
    if (depth >= MAX_NESTING) return undefined;
    if (Array.isArray(value)) {
      if (value.length > maxArray) return undefined;
      for (let i = value.length - 1; i >= 0; i--) {
        const v: unknown = value[i];
        if (v !== null && typeof v === 'object') {
          open.push(v);
          depths.push(depth + 1);
        }
      }
      continue;
    }
    for (const key in value) {
      keys += 1;
      if (mayBeForbidden(key)) return undefined;
      const v = (value as Record<string, unknown>)[key];
      if (v === null || typeof v !== 'object') continue;
      if (isNumberList(key) && Array.isArray(v)) {
        // Measurement lists are the one place long lists belong; the study schema caps them itself.
        if (depth + 1 >= MAX_NESTING) return undefined;
        for (let i = 0; i < v.length; i++) {
          const n: unknown = v[i];
          if (n !== null && typeof n === 'object') return undefined;
        }
        continue;
      }
      open.push(v);
      depths.push(depth + 1);
    }
  }
  return keys;
}

/**
 * The walk that names a problem's place: the first problem in reading order with its path, and the keys counted
 * up to it. Only files quickWalk found a problem in come here.
 */
export function walkNamingProblems(
  root: unknown,
  maxArray: number
): { problem: string | undefined; keys: number } {
  const stack: Node[] = [{ value: root, parent: undefined, key: '', depth: 0 }];
  let keys = 0;
  const found = (problem: string) => ({ problem, keys });
  while (stack.length > 0) {
    const node = stack.pop()!;
    const value = node.value;
    if (value === null || typeof value !== 'object') continue;
    if (node.depth >= MAX_NESTING)
      return found(`${pathOf(node)} is nested more than ${MAX_NESTING} levels deep`);
    if (Array.isArray(value)) {
      // Measurement lists are the one place long lists belong; the study schema caps them itself.
      if (isNumberList(node.key)) {
        const nested = value.findIndex((v) => v !== null && typeof v === 'object');
        if (nested >= 0) {
          return found(
            `${pathOf({ value: undefined, parent: node, key: nested, depth: 0 })} must be a number, not a list or object`
          );
        }
        continue;
      }
      if (value.length > maxArray) {
        return found(
          `${pathOf(node)} holds ${value.length.toLocaleString('en')} entries, more than the ${maxArray.toLocaleString('en')} allowed`
        );
      }
      for (let i = value.length - 1; i >= 0; i--) {
        const v: unknown = value[i];
        if (v !== null && typeof v === 'object')
          stack.push({ value: v, parent: node, key: i, depth: node.depth + 1 });
      }
      continue;
    }
    const own = Object.keys(value);
    keys += own.length;
    for (const key of own) {
      if (FORBIDDEN_KEYS.has(key)) {
        return found(
          `${pathOf({ value: undefined, parent: node, key, depth: 0 })}: the key "${key}" is not allowed in a Capstan file`
        );
      }
      const v = (value as Record<string, unknown>)[key];
      if (v !== null && typeof v === 'object')
        stack.push({ value: v, parent: node, key, depth: node.depth + 1 });
    }
  }
  return { problem: undefined, keys };
}
