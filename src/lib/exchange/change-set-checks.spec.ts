import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { emptyRecords, RECORD_KINDS, type RecordsByKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import { idsDistinctInOrder } from './change-set-checks';

/** Record sets whose ids come from a small pool, so that repeats within and across kinds are common. */
const pooledId = fc.integer({ min: 0, max: 59 }).map((n) => `id-${String(n).padStart(2, '0')}`);
const idLists = fc.array(fc.array(pooledId, { maxLength: 4 }), {
  minLength: RECORD_KINDS.length,
  maxLength: RECORD_KINDS.length
});

function recordSet(lists: string[][], sorted: boolean): RecordsByKind {
  const records = emptyRecords() as unknown as Record<string, RecordMeta[]>;
  RECORD_KINDS.forEach((kind, k) => {
    const ids = sorted ? [...new Set(lists[k])].sort() : lists[k]!;
    records[kind] = ids.map((id) => ({ id }) as RecordMeta);
  });
  return records as unknown as RecordsByKind;
}

describe('ids told apart without a map', () => {
  it('are found distinct exactly when every id is used once and each kind is in id order (property)', () => {
    let distinct = 0;
    fc.assert(
      fc.property(idLists, fc.boolean(), (lists, sorted) => {
        const records = recordSet(lists, sorted);
        const all = RECORD_KINDS.flatMap((kind) => (records[kind] as RecordMeta[]).map((r) => r.id));
        const inOrder = RECORD_KINDS.every((kind) =>
          (records[kind] as RecordMeta[]).every((r, i, list) => i === 0 || list[i - 1]!.id < r.id)
        );
        const expected = inOrder && new Set(all).size === all.length;
        expect(idsDistinctInOrder(records)).toBe(expected);
        if (expected) distinct += 1;
      }),
      { numRuns: 2000, seed: 20261205 }
    );
    // Both answers were given often.
    expect(distinct).toBeGreaterThan(100);
    expect(distinct).toBeLessThan(1900);
  });
});
