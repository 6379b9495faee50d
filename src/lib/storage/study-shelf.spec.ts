import { describe, expect, it } from 'vitest';
import { seqOf, shelvedStudy } from '../../../tests/support/shelved-study';
import { shelfOf, shelfProblems } from './study-shelf';

const study = shelvedStudy;

describe('a study shelf', () => {
  it('orders its studies by month then id, counts them, and carries their highest write sequence', () => {
    const shelf = shelfOf('c', [
      study('b', 'c', '2026-02', 5),
      study('z', 'c', '2026-01', 9),
      study('a', 'c', '2026-02', 7)
    ]);
    expect(shelf.studies.map((s) => s.id)).toEqual(['z', 'a', 'b']);
    expect(shelf).toMatchObject({ size: 3, localSeq: 9 });
    expect(shelfProblems([shelf])).toEqual([]);
  });

  it('stamps the studies written now (no sequence yet) and keeps the others', () => {
    const shelf = shelfOf('c', [study('a', 'c', '2026-01', 5), study('b', 'c', '2026-02')], 12);
    expect(shelf.studies.map(seqOf)).toEqual([5, 12]);
    expect(shelf.localSeq).toBe(12);
  });

  it('names every broken rule: size, sequence, another characteristic, a study twice, order', () => {
    const good = shelfOf('c', [study('a', 'c', '2026-01', 1), study('b', 'c', '2026-02', 2)]);
    expect(shelfProblems([{ ...good, size: 3 }])).toEqual(['shelf c: size 3, 2 studies']);
    expect(shelfProblems([{ ...good, localSeq: 1 }])).toEqual([
      "shelf c: localSeq 1, its studies' highest 2"
    ]);
    expect(shelfProblems([good, shelfOf('d', [study('a', 'd', '2026-01', 1)])])).toEqual([
      'shelf d: study a stored twice'
    ]);
    expect(shelfProblems([shelfOf('c', [study('x', 'e', '2026-01', 1)])])).toEqual([
      'shelf c: study x names characteristic e'
    ]);
    expect(shelfProblems([{ ...good, studies: [...good.studies].reverse() }])).toEqual([
      'shelf c: study a out of order'
    ]);
  });
});
