/**
 * The first `count` items of `items` that `keep` lets through, in the order of `compare` — what
 * `items.filter(keep).sort(compare).slice(0, count)` gives (equal items in their order in `items`, as a stable
 * sort keeps them), without sorting them all: one pass that keeps the best `count` so far in order. The review
 * lists and charts the first 40 or 100 of a line per process; sorting 20 000 lines several times over was most
 * of a task of 0.2 s on the page.
 */
export function firstInOrder<T>(
  items: readonly T[],
  count: number,
  compare: (a: T, b: T) => number,
  keep: (item: T) => boolean = () => true
): T[] {
  const best: T[] = [];
  if (count <= 0) return best;
  for (const item of items) {
    if (!keep(item)) continue;
    if (best.length === count && compare(item, best[count - 1]!) >= 0) continue;
    // After every item that does not come after it: equal items keep their order.
    let lo = 0;
    let hi = best.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (compare(item, best[mid]!) < 0) hi = mid;
      else lo = mid + 1;
    }
    best.splice(lo, 0, item);
    if (best.length > count) best.pop();
  }
  return best;
}
