/**
 * A memo for pure numeric functions of a few arguments, bounded so that it cannot grow without end: when full it
 * is emptied and refills. Quantiles of the chi-square and beta distributions are iterative and a portfolio asks
 * for the same few degrees of freedom (the same sample sizes) thousands of times.
 */
export function boundedMemo<Args extends readonly (number | string)[], T>(
  fn: (...args: Args) => T,
  limit = 50_000
): (...args: Args) => T {
  const known = new Map<string, T>();
  return (...args: Args): T => {
    const key = args.join('|');
    let value = known.get(key);
    if (value === undefined && !known.has(key)) {
      value = fn(...args);
      if (known.size >= limit) known.clear();
      known.set(key, value);
    }
    return value as T;
  };
}
