/**
 * A memo for pure numeric functions of a few arguments, bounded so that it cannot grow without end: when full it
 * is emptied and refills. Quantiles of the chi-square and beta distributions are iterative and a portfolio asks
 * for the same few degrees of freedom (the same sample sizes) thousands of times. Keys are the arguments
 * themselves in nested maps (no key string is built per call).
 */
export function boundedMemo<Args extends readonly number[], T>(
  fn: (...args: Args) => T,
  limit = 50_000
): (...args: Args) => T {
  let root = new Map<number, unknown>();
  let size = 0;
  return (...args: Args): T => {
    let level = root;
    for (let i = 0; i < args.length - 1; i += 1) {
      let next = level.get(args[i]!) as Map<number, unknown> | undefined;
      if (!next) level.set(args[i]!, (next = new Map()));
      level = next;
    }
    const last = args[args.length - 1]!;
    if (level.has(last)) return level.get(last) as T;
    const value = fn(...args);
    if (size >= limit) {
      root = new Map();
      size = 0;
      return value;
    }
    level.set(last, value);
    size += 1;
    return value;
  };
}
