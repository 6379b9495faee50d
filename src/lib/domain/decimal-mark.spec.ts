import { describe, expect, it } from 'vitest';
import { inferDecimalMark } from './decimal-mark';
import { implausibleEntry, studyDataFromForm, emptyEntryForm } from './entry-form';
import { parseLocaleNumber } from './locale-number';
import { parsePastedValues } from './pasted-values';

describe('the decimal mark of a block of numbers (one rule for pasting and files)', () => {
  it.each([
    [['0,213', '0,198', '0,207'], ',', false],
    [['12,5', '12,75'], ',', false],
    [['12.5', '12.75'], '.', false],
    [['1.234,5', '2.001,25'], ',', false],
    [['1,234.5'], '.', false],
    [['1,234,567'], '.', false],
    [['1.234.567'], ',', false],
    [['1,234', '2,500'], '.', true],
    [['1,234', '0,5'], ',', false],
    [['12', '13'], '.', false]
  ] as const)('%j → %s (ambiguous: %s)', (cells, mark, ambiguous) => {
    const r = inferDecimalMark(cells, '.');
    expect(r.mark).toBe(mark);
    expect(r.ambiguous).toBe(ambiguous);
  });

  it('falls back to the locale only when the cells say nothing', () => {
    expect(inferDecimalMark(['12', '13'], ',').mark).toBe(',');
    expect(inferDecimalMark(['12,5'], '.').mark).toBe(',');
  });

  it('asks only where the locale would read a cell as thousands', () => {
    // 24,995 in a decimal-comma locale is a decimal, as its writer means it; in a point locale it is asked about.
    expect(inferDecimalMark(['24,995', '24,991'], ',')).toEqual({ mark: ',', ambiguous: false });
    expect(inferDecimalMark(['24,995', '24,991'], '.')).toEqual({
      mark: '.',
      ambiguous: true,
      example: '24,995'
    });
    expect(inferDecimalMark(['1.234'], ',')).toEqual({ mark: ',', ambiguous: true, example: '1.234' });
  });

  it('never reads a lead group of 0 as thousands: 0,213 is not 213 under any stated mark', () => {
    expect(parseLocaleNumber('0,213', '.')).toBeUndefined();
    expect(parseLocaleNumber('0,213', ',')).toBe(0.213);
  });
});

describe('pasted values with decimal commas in a point-decimal browser', () => {
  const block = ['0,213', '0,198', '0,207', '0,221', '0,215'].join('\n');

  it('reads 0,213 as 0.213, not 213 (the mean stays 0.21)', () => {
    const r = parsePastedValues(block, 'auto', '.');
    expect(r.values).toEqual([0.213, 0.198, 0.207, 0.221, 0.215]);
    expect(r.decimal).toEqual({ mark: ',', ambiguous: false });
    const form = { ...emptyEntryForm('measured'), kind: 'raw' as const, raw: block };
    const reading = studyDataFromForm(form, '.');
    expect(reading.data).toEqual({ kind: 'raw', values: [0.213, 0.198, 0.207, 0.221, 0.215] });
  });

  it('asks about 1,234 and reads it as the person says', () => {
    const form = { ...emptyEntryForm('measured'), kind: 'raw' as const, raw: '1,234\n1,250\n1,241' };
    const asked = studyDataFromForm(form, '.');
    expect(asked.data).toBeUndefined();
    expect(asked.askDecimal).toEqual({ example: '1,234', withPoint: '1234', withComma: '1.234' });
    expect(studyDataFromForm({ ...form, rawDecimal: ',' }, '.').data).toEqual({
      kind: 'raw',
      values: [1.234, 1.25, 1.241]
    });
    expect(studyDataFromForm({ ...form, rawDecimal: '.' }, '.').data).toEqual({
      kind: 'raw',
      values: [1234, 1250, 1241]
    });
  });
});

describe('figures questioned before saving', () => {
  const ch = { lsl: 0.19, usl: 0.23, unit: 'mm', physicalMin: 0 };
  it('questions values 1 000 times too large, and accepts plausible ones silently', () => {
    expect(implausibleEntry({ kind: 'raw', values: [213, 198, 207] }, ch)).toMatch(
      /far outside the limits \(LSL 0\.19, USL 0\.23 mm\)/
    );
    expect(implausibleEntry({ kind: 'raw', values: [0.213, 0.198, 0.25] }, ch)).toBeUndefined();
    expect(implausibleEntry({ kind: 'summary', n: 30, mean: -1, sd: 0.01 }, ch)).toMatch(
      /below the physical minimum/
    );
    expect(implausibleEntry({ kind: 'defectives', units: 10, defectives: 1 }, ch)).toBeUndefined();
  });
});
