import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Characteristic } from './characteristic';
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

const characteristic = (id: string, processId: string): Characteristic => ({
  ...meta(id),
  processId,
  name: id,
  unit: '',
  dataKind: 'measured',
  riskClass: 'standard'
});

describe('a copy of the record index', () => {
  // A write: a study (of one of three characteristics and months, so that months fill, empty and hold two) or a
  // characteristic (of one of two processes), by one of a few ids so that writes replace one another.
  const write = fc.oneof(
    fc.record({
      kind: fc.constant('studies' as const),
      id: fc.constantFrom('s1', 's2', 's3', 's4', 's5'),
      characteristicId: fc.constantFrom('c1', 'c2', 'c3'),
      period: fc.constantFrom('2026-01', '2026-02', '2026-03')
    }),
    fc.record({
      kind: fc.constant('characteristics' as const),
      id: fc.constantFrom('c1', 'c2', 'c3'),
      processId: fc.constantFrom('p1', 'p2')
    })
  );
  type Write = typeof write extends fc.Arbitrary<infer T> ? T : never;
  const apply = (index: RecordIndex, w: Write) =>
    w.kind === 'studies'
      ? index.set('studies', study(w.id, w.characteristicId, w.period))
      : index.set('characteristics', characteristic(w.id, w.processId));
  /** Everything the index answers, for the ids and months the writes use. */
  const seen = (index: RecordIndex) => ({
    records: ['s1', 's2', 's3', 's4', 's5', 'c1', 'c2', 'c3'].map((id) => index.get(id) ?? null),
    months: ['c1', 'c2', 'c3'].flatMap((c) =>
      ['2026-01', '2026-02', '2026-03'].map((p) => [
        index.studyCountOfMonth(c, p),
        index.studiesOfMonth(c, p).map((s) => s.id)
      ])
    ),
    children: [
      ...['p1', 'p2'].map((p) => index.childrenOf('processes', p).map((c) => c.record.id)),
      ...['c1', 'c2', 'c3'].map((c) => index.childrenOf('characteristics', c).map((s) => s.record.id))
    ],
    descendants: index.descendantsOf('processes', 'p1').map((d) => d.record.id),
    values: [...index.values()].map((v) => v.record.id).sort()
  });
  const built = (...writes: Write[][]) => {
    const index = new RecordIndex();
    for (const w of writes.flat()) apply(index, w);
    return index;
  };

  it('answers as an index given every write, and leaves the index it was copied from as it was (3 000 runs)', () => {
    fc.assert(
      fc.property(
        fc.array(write, { maxLength: 12 }),
        fc.array(write, { maxLength: 12 }),
        fc.array(write, { maxLength: 8 }),
        (before, onCopy, onCopyOfCopy) => {
          const original = built(before);
          const copy = original.copy();
          for (const w of onCopy) apply(copy, w);
          const copyOfCopy = copy.copy();
          for (const w of onCopyOfCopy) apply(copyOfCopy, w);
          expect(seen(copyOfCopy)).toEqual(seen(built(before, onCopy, onCopyOfCopy)));
          expect(seen(copy)).toEqual(seen(built(before, onCopy)));
          expect(seen(original)).toEqual(seen(built(before)));
        }
      ),
      { numRuns: 3000 }
    );
  });

  it('refuses to be read once the index under it has changed', () => {
    const original = new RecordIndex({ studies: [study('a', 'c1', '2026-01')] });
    const copy = original.copy();
    expect(copy.record('a')?.id).toBe('a');
    original.set('studies', study('b', 'c1', '2026-01'));
    expect(() => copy.record('a')).toThrow(/changed while a copy of it was in use/);
    expect(() => copy.studiesOfMonth('c1', '2026-01')).toThrow(/changed while a copy/);
  });
});
