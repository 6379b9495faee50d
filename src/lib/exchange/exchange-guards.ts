/**
 * Checks run on a parsed exchange file before schema validation, so that a hostile file is refused quickly
 * and with a message that says where: nesting depth, keys that could reach an object's prototype when copied
 * (`__proto__`, `constructor`, `prototype`), and list lengths. And, after validation, text that carries active
 * markup — Capstan never renders imported text as markup, but a file that tries is refused rather than kept,
 * since its text also ends up in CSV files and other people's tools.
 */
export const MAX_NESTING = 16;
export const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/**
 * Markup that could run code or fetch content if some other program rendered the text: script-like elements,
 * event-handler or style attributes inside a tag, and script URLs. Plain angle brackets and harmless tags
 * (`<b>`, `a < b`) are text like any other and pass.
 */
const ACTIVE_MARKUP =
  /<\s*\/?\s*(script|iframe|frame|frameset|object|embed|applet|style|link|meta|base|svg|math|template|form)\b|<[a-z!][^>]*\s(on[a-z]+|style|srcdoc|formaction|xlink:href)\s*=|(java|vb)script\s*:|data\s*:\s*text\/html/i;

export function activeMarkupIn(text: string): string | undefined {
  const m = ACTIVE_MARKUP.exec(text);
  return m ? m[0].slice(0, 24) : undefined;
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

/** First structural problem of a parsed value, or undefined. Iterative, so depth cannot overflow the stack. */
export function structuralProblem(root: unknown, maxArray: number): string | undefined {
  const stack: Node[] = [{ value: root, parent: undefined, key: '', depth: 0 }];
  while (stack.length > 0) {
    const node = stack.pop()!;
    const value = node.value;
    if (value === null || typeof value !== 'object') continue;
    if (node.depth >= MAX_NESTING) return `${pathOf(node)} is nested more than ${MAX_NESTING} levels deep`;
    if (Array.isArray(value)) {
      // Measurement lists are the one place long lists belong; the study schema caps them itself.
      if (isNumberList(node.key)) {
        const nested = value.findIndex((v) => v !== null && typeof v === 'object');
        if (nested >= 0) {
          return `${pathOf({ value: undefined, parent: node, key: nested, depth: 0 })} must be a number, not a list or object`;
        }
        continue;
      }
      if (value.length > maxArray) {
        return `${pathOf(node)} holds ${value.length.toLocaleString('en')} entries, more than the ${maxArray.toLocaleString('en')} allowed`;
      }
      for (let i = value.length - 1; i >= 0; i--) {
        const v: unknown = value[i];
        if (v !== null && typeof v === 'object')
          stack.push({ value: v, parent: node, key: i, depth: node.depth + 1 });
      }
      continue;
    }
    for (const key of Object.keys(value)) {
      if (FORBIDDEN_KEYS.has(key)) {
        return `${pathOf({ value: undefined, parent: node, key, depth: 0 })}: the key "${key}" is not allowed in a Capstan file`;
      }
      const v = (value as Record<string, unknown>)[key];
      if (v !== null && typeof v === 'object')
        stack.push({ value: v, parent: node, key, depth: node.depth + 1 });
    }
  }
  return undefined;
}

/** First text value holding active markup, as `path: what`. */
export function markupProblem(root: unknown): string | undefined {
  const stack: Node[] = [{ value: root, parent: undefined, key: '', depth: 0 }];
  while (stack.length > 0) {
    const node = stack.pop()!;
    const value = node.value;
    if (typeof value === 'string') {
      const hit = activeMarkupIn(value);
      if (hit) {
        return `${pathOf(node)} holds markup that could run as code ("${hit}…"); Capstan does not accept it — remove it where the file was made`;
      }
      continue;
    }
    if (value === null || typeof value !== 'object') continue;
    if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i--) {
        const v: unknown = value[i];
        if (typeof v === 'string' || (v !== null && typeof v === 'object'))
          stack.push({ value: v, parent: node, key: i, depth: 0 });
      }
    } else {
      const keys = Object.keys(value);
      for (let i = keys.length - 1; i >= 0; i--) {
        const key = keys[i]!;
        const v = (value as Record<string, unknown>)[key];
        if (typeof v === 'string' || (v !== null && typeof v === 'object'))
          stack.push({ value: v, parent: node, key, depth: 0 });
      }
    }
  }
  return undefined;
}
