import { describe, expect, it } from 'vitest';
import { emptyEntryForm, studyDataFromForm } from './entry-form';

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
