import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { emptyEntryForm, entryFormOf, studyDataFromForm } from './entry-form';
import type { StudyData } from './study';

describe('entry form reading', () => {
  it('reads a summary typed with a decimal comma', () => {
    const form = { ...emptyEntryForm('measured'), n: '30', mean: '10,02', sd: '0,015' };
    expect(studyDataFromForm(form)).toEqual({
      data: { kind: 'summary', n: 30, mean: 10.02, sd: 0.015 },
      problems: []
    });
  });

  it('names each field that is missing or wrong', () => {
    const form = { ...emptyEntryForm('measured'), n: '1,5', mean: 'ten', sd: '' };
    expect(studyDataFromForm(form).problems.map((p) => p.field)).toEqual(['n', 'mean', 'sd']);
  });

  it('reads counts and refuses impossible ones', () => {
    const ok = studyDataFromForm({ ...emptyEntryForm('counted'), units: '1.200', defectives: '3' }, ',');
    expect(ok.data).toEqual({ kind: 'defectives', units: 1200, defectives: 3 });
    const bad = studyDataFromForm({ ...emptyEntryForm('counted'), units: '10', defectives: '11' });
    expect(bad.problems).toEqual([
      { field: 'defectives', message: 'Defectives (11) cannot exceed units inspected (10)' }
    ]);
    const defects = studyDataFromForm({
      ...emptyEntryForm('counted'),
      kind: 'defects',
      units: '10',
      defects: '3',
      opportunities: '4'
    });
    expect(defects.data).toEqual({ kind: 'defects', units: 10, defects: 3, opportunitiesPerUnit: 4 });
  });

  it('reads a pasted raw block and says what it read', () => {
    const r = studyDataFromForm({
      ...emptyEntryForm('measured'),
      kind: 'raw',
      raw: 'Group\tValue\na\t1,5\na\t1,6\nb\t1,4'
    });
    expect(r.data).toEqual({ kind: 'raw', values: [1.5, 1.6, 1.4], subgroups: ['a', 'a', 'b'] });
    expect(r.rawSummary).toBe("3 values in 2 subgroups; header 'Group, Value' skipped");
  });
});

describe('correcting a saved study', () => {
  const measure = fc
    .integer({ min: -99_999_999, max: 99_999_999 })
    .chain((m) => fc.integer({ min: 0, max: 6 }).map((d) => m / 10 ** d));
  const data: fc.Arbitrary<StudyData> = fc.oneof(
    fc.record({
      kind: fc.constant('summary' as const),
      n: fc.integer({ min: 2, max: 5000 }),
      mean: measure,
      sd: measure.map(Math.abs)
    }),
    fc.array(measure, { minLength: 2, maxLength: 40 }).chain((values) =>
      fc.oneof(
        fc.constant({ kind: 'raw' as const, values }),
        fc.constant({
          kind: 'raw' as const,
          values,
          subgroups: values.map((_, i) => `g${Math.floor(i / 5)}`)
        })
      )
    ),
    fc.integer({ min: 1, max: 1e6 }).chain((units) =>
      fc.record({
        kind: fc.constant('defectives' as const),
        units: fc.constant(units),
        defectives: fc.integer({ min: 0, max: units })
      })
    ),
    fc
      .record({
        units: fc.integer({ min: 1, max: 10_000 }),
        opportunitiesPerUnit: fc.integer({ min: 1, max: 50 })
      })
      .chain(({ units, opportunitiesPerUnit }) =>
        fc.record({
          kind: fc.constant('defects' as const),
          units: fc.constant(units),
          defects: fc.integer({ min: 0, max: units * opportunitiesPerUnit }),
          opportunitiesPerUnit: fc.constant(opportunitiesPerUnit)
        })
      )
  );

  it('opens the form on the study as saved, which reads back to the same data (property)', () => {
    fc.assert(
      fc.property(data, fc.constantFrom('.' as const, ',' as const), (saved, decimal) => {
        const counted = saved.kind === 'defectives' || saved.kind === 'defects';
        const form = entryFormOf({ data: saved, note: 'checked' }, counted ? 'counted' : 'measured', decimal);
        expect(form.kind).toBe(saved.kind);
        expect(form.note).toBe('checked');
        expect(studyDataFromForm(form, decimal).data).toEqual(saved);
      }),
      { numRuns: 500 }
    );
  });

  it('starts a new counted entry on what the characteristic counts, with its own opportunities per unit', () => {
    const form = emptyEntryForm({ dataKind: 'counted', countedAs: 'defects', opportunitiesPerUnit: 8 });
    expect(form.kind).toBe('defects');
    expect(form.opportunities).toBe('8');
    expect(emptyEntryForm('counted').opportunities).toBe('1');
  });
});
