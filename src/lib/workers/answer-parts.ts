/**
 * Long lists of a worker's answer, sent ahead of it in parts. The page copies a message in when it reads it, in
 * one task: the review of 20 000 processes answered in one message (13 MB, a line per process twice) was a task
 * of 0.16–0.29 s on the page; a part of 1 000 lines is some 10 ms. The answer then arrives with those lists
 * empty, and the page appends the parts, in the order they came, before it uses the answer.
 */
export interface AnswerPart {
  id: number;
  type: 'part';
  /** Keys from the answer down to the list. */
  path: readonly string[];
  entries: unknown[];
}

/** Entries per part. */
export const ENTRIES_PER_PART = 1000;

/**
 * The parts of the lists at `paths` (paths of keys into the answer), and the answer with those lists empty —
 * copied along each path, so that nothing the worker keeps changes.
 */
export function answerInParts<T extends object>(
  id: number,
  answer: T,
  paths: readonly (readonly string[])[],
  perPart = ENTRIES_PER_PART
): { parts: AnswerPart[]; answer: T } {
  const parts: AnswerPart[] = [];
  let light = answer;
  for (const path of paths) {
    const list = listAt(light, path);
    for (let at = 0; at < list.length; at += perPart)
      parts.push({ id, type: 'part', path, entries: list.slice(at, at + perPart) });
    light = withEmptyList(light, path);
  }
  return { parts, answer: light };
}

/** Appends a part's entries to the list at its path in the answer (which came with it empty). */
export function appendPart(answer: object, part: AnswerPart): void {
  const list = listAt(answer, part.path);
  for (const entry of part.entries) list.push(entry);
}

function listAt(answer: object, path: readonly string[]): unknown[] {
  let at: unknown = answer;
  for (const key of path) at = (at as Record<string, unknown> | undefined)?.[key];
  if (!Array.isArray(at)) throw new Error(`No list at ${path.join('.')} in the answer`);
  return at;
}

function withEmptyList<T extends object>(answer: T, path: readonly string[]): T {
  const [key, ...rest] = path;
  if (key === undefined) return [] as unknown as T;
  const inner = (answer as Record<string, unknown>)[key] as object;
  return { ...answer, [key]: withEmptyList(inner, rest) };
}
