import type { Study } from '../domain/study';

/**
 * Every study of one characteristic, live and deleted, as one stored record (schema v10, schema-versions.ts):
 * IndexedDB's cost is by the record written, and a company's file writes 36 studies a characteristic. A study is
 * found by its characteristic; nothing else indexes it. Each study keeps its own `localSeq`; the shelf's is the
 * highest of them, so "changed since" is a range of one index and then a filter of the shelves it returns.
 */
export interface StudyShelf {
  characteristicId: string;
  /** In month order, then by id (the order the v9 index `[characteristicId+period]` gave). */
  studies: Study[];
  /** Highest `localSeq` of its studies (absent only on a shelf without studies). */
  localSeq?: number;
  /** Number of studies. */
  size: number;
}

/** Orders studies as a shelf holds them: by month, then by id, both compared as IndexedDB compares strings. */
export function byMonthThenId(a: Study, b: Study): number {
  if (a.period !== b.period) return a.period < b.period ? -1 : 1;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

function seqOf(s: Study): number | undefined {
  return (s as Study & { localSeq?: number }).localSeq;
}

/**
 * A shelf holding `studies` (ordered here), its `size` and `localSeq` derived from them. A study without a
 * `localSeq` is stamped with `seq` when one is given (the write sequence's middleware, storage/local-sequence.ts).
 */
export function shelfOf(characteristicId: string, studies: readonly Study[], seq?: number): StudyShelf {
  const stamped =
    seq === undefined
      ? [...studies]
      : studies.map((s) => (seqOf(s) === undefined ? ({ ...s, localSeq: seq } as Study) : s));
  stamped.sort(byMonthThenId);
  let high: number | undefined;
  for (const s of stamped) {
    const q = seqOf(s);
    if (q !== undefined && (high === undefined || q > high)) high = q;
  }
  return {
    characteristicId,
    studies: stamped,
    ...(high !== undefined ? { localSeq: high } : {}),
    size: stamped.length
  };
}

/**
 * What must hold of the stored shelves, in words (empty when all holds): every study stored once, on the shelf of
 * its characteristic, in shelf order; each shelf's `size` its number of studies and its `localSeq` the highest of
 * theirs. Checked over random multi-device histories (tests/unit/multi-device-histories.spec.ts).
 */
export function shelfProblems(shelves: readonly StudyShelf[]): string[] {
  const problems: string[] = [];
  const seen = new Set<string>();
  for (const shelf of shelves) {
    const at = `shelf ${shelf.characteristicId}`;
    if (shelf.size !== shelf.studies.length)
      problems.push(`${at}: size ${shelf.size}, ${shelf.studies.length} studies`);
    const derived = shelfOf(shelf.characteristicId, shelf.studies);
    if (derived.localSeq !== shelf.localSeq)
      problems.push(`${at}: localSeq ${shelf.localSeq}, its studies' highest ${derived.localSeq}`);
    shelf.studies.forEach((s, i) => {
      if (s.characteristicId !== shelf.characteristicId)
        problems.push(`${at}: study ${s.id} names characteristic ${s.characteristicId}`);
      if (seen.has(s.id)) problems.push(`${at}: study ${s.id} stored twice`);
      seen.add(s.id);
      if (i > 0 && byMonthThenId(shelf.studies[i - 1]!, s) >= 0)
        problems.push(`${at}: study ${s.id} out of order`);
    });
  }
  return problems;
}
