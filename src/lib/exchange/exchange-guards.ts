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

/** First structural problem of a parsed value, or undefined. Iterative, so depth cannot overflow the stack. */
export function structuralProblem(root: unknown, maxArray: number): string | undefined {
  const stack: { value: unknown; path: (string | number)[] }[] = [{ value: root, path: [] }];
  while (stack.length > 0) {
    const { value, path } = stack.pop()!;
    if (value === null || typeof value !== 'object') continue;
    if (path.length >= MAX_NESTING) return `${pathText(path)} is nested more than ${MAX_NESTING} levels deep`;
    if (Array.isArray(value)) {
      // Measurement lists are the one place long lists belong; the study schema caps them itself.
      const isValues = path[path.length - 1] === 'values' || path[path.length - 1] === 'subgroups';
      if (!isValues && value.length > maxArray) {
        return `${pathText(path)} holds ${value.length.toLocaleString('en')} entries, more than the ${maxArray.toLocaleString('en')} allowed`;
      }
      if (isValues) {
        // Values are numbers or strings: nothing below them to walk, but a nested object there is refused.
        const nested = value.findIndex((v) => v !== null && typeof v === 'object');
        if (nested >= 0) return `${pathText([...path, nested])} must be a number, not a list or object`;
        continue;
      }
      for (let i = value.length - 1; i >= 0; i--) stack.push({ value: value[i], path: [...path, i] });
      continue;
    }
    for (const key of Object.keys(value)) {
      if (FORBIDDEN_KEYS.has(key))
        return `${pathText([...path, key])}: the key "${key}" is not allowed in a Capstan file`;
      stack.push({ value: (value as Record<string, unknown>)[key], path: [...path, key] });
    }
  }
  return undefined;
}

/** First text value holding active markup, as `path: what`. */
export function markupProblem(root: unknown): string | undefined {
  const stack: { value: unknown; path: (string | number)[] }[] = [{ value: root, path: [] }];
  while (stack.length > 0) {
    const { value, path } = stack.pop()!;
    if (typeof value === 'string') {
      const hit = activeMarkupIn(value);
      if (hit)
        return `${pathText(path)} holds markup that could run as code ("${hit}…"); Capstan does not accept it — remove it where the file was made`;
      continue;
    }
    if (value === null || typeof value !== 'object') continue;
    if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i--) {
        const v: unknown = value[i];
        if (typeof v === 'number') continue;
        stack.push({ value: v, path: [...path, i] });
      }
    } else {
      for (const key of Object.keys(value).reverse())
        stack.push({ value: (value as Record<string, unknown>)[key], path: [...path, key] });
    }
  }
  return undefined;
}
