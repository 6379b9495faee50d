/**
 * Record ids for the benches' generated portfolios, shaped as the app makes them: random version-4 UUIDs (from a
 * seeded generator, so that every run holds the same portfolio). Counted ids (`p12`, `…-000000000012`) came out
 * in the order the records were made, so a portfolio read back in id order — as IndexedDB returns a table, and
 * as an exported file lists it — walked its processes in the order of the read model's rows; in the app that
 * order has nothing to do with the rows', and a first ranking at 20 000 processes took some 10 % longer with
 * the processes in an unrelated order (a probe, shuffling them).
 */
export function seededIds(seed: number): () => string {
  let s = seed;
  // Park–Miller (as the benches' data): 31 random bits per draw, of which 28 (seven hex digits) are used.
  const hex7 = () => {
    s = (s * 48271) % 2147483647;
    return (s & 0xfffffff).toString(16).padStart(7, '0');
  };
  return () => {
    const h = hex7() + hex7() + hex7() + hex7() + hex7();
    const variant = '89ab'[parseInt(h[16]!, 16) & 3]!;
    return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(12, 15)}-${variant}${h.slice(17, 20)}-${h.slice(20, 32)}`;
  };
}

/** Records in the order IndexedDB returns a table and an exported file lists it: by id. */
export function inIdOrder<T extends { id: string }>(records: T[]): T[] {
  return records.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}
