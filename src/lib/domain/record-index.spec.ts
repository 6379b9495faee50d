import { describe, expect, it } from 'vitest';
import { RecordIndex } from './record-index';
import type { Study } from './study';

const meta = (id: string) => ({ id, createdAt: '', updatedAt: '', rev: 1, deviceId: 'd' });
const study = (id: string, characteristicId: string, period: string): Study => ({
  ...meta(id),
  characteristicId,
  period,
  enteredBy: '',
  data: { kind: 'summary', n: 10, mean: 1, sd: 1 }
});

describe('the record index', () => {
  it('finds the studies of a month, and follows a study moved to another month', () => {
    const index = new RecordIndex({ studies: [study('a', 'c1', '2026-01'), study('b', 'c1', '2026-01')] });
    expect(index.studiesOfMonth('c1', '2026-01').map((s) => s.id)).toEqual(['a', 'b']);
    index.set('studies', study('a', 'c1', '2026-02'));
    expect(index.studiesOfMonth('c1', '2026-01').map((s) => s.id)).toEqual(['b']);
    expect(index.studiesOfMonth('c1', '2026-02').map((s) => s.id)).toEqual(['a']);
    expect(index.studiesOfMonth('c2', '2026-01')).toEqual([]);
  });

  it('copies into an index that changes without changing the original', () => {
    const original = new RecordIndex({
      studies: [study('a', 'c1', '2026-01')],
      characteristics: [
        { ...meta('c1'), processId: 'p1', name: 'c', unit: '', dataKind: 'measured', riskClass: 'standard' }
      ]
    });
    const copy = original.copy();
    copy.set('studies', study('b', 'c1', '2026-01'));
    copy.set('studies', study('a', 'c1', '2026-03'));
    expect(original.studiesOfMonth('c1', '2026-01').map((s) => s.id)).toEqual(['a']);
    expect(original.childrenOf('characteristics', 'c1').map((c) => c.record.id)).toEqual(['a']);
    expect(original.record('b')).toBeUndefined();
    expect(copy.studiesOfMonth('c1', '2026-01').map((s) => s.id)).toEqual(['b']);
    expect(
      copy
        .childrenOf('characteristics', 'c1')
        .map((c) => c.record.id)
        .sort()
    ).toEqual(['a', 'b']);
  });
});
