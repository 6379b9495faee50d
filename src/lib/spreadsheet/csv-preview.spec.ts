import { describe, expect, it } from 'vitest';
import { guessColumn, guessMapping, previewCsv } from './csv-preview';

describe('CSV preview', () => {
  it('detects semicolons, decimal commas and a header, and drops a cut-off last line', () => {
    const p = previewCsv(
      'Merkmal;Datum;Wert\nNet fill weight;02.03.2026;503,1\nNet fill weight;03.03.2026;502,4\nNet fi'
    );
    expect(p.delimiter).toBe(';');
    expect(p.decimal).toBe(',');
    expect(p.hasHeader).toBe(true);
    expect(p.columns).toEqual(['Merkmal', 'Datum', 'Wert']);
    expect(p.rows).toHaveLength(2);
    expect(guessColumn(p.columns, ['datum', 'date'])).toBe(1);
  });

  it('sees no header in a plain column of numbers', () => {
    const p = previewCsv('1.5\n1.6\n1.7\n');
    expect(p.hasHeader).toBe(false);
    expect(p.columns).toEqual(['column 1']);
  });
});

describe('a first mapping of German headers', () => {
  it('never takes a date column for the values: "Datum" holds digits but no numbers', () => {
    const p = previewCsv('Datum;Messwert\n03.09.2026;10,2\n04.09.2026;10,4\n05.09.2026;10,1\n');
    const guess = guessMapping(p);
    expect(p.columns[guess.value]).toBe('Messwert');
    expect(p.columns[guess.period]).toBe('Datum');
  });
});

describe('first guesses of an import', () => {
  it('never takes a German date column for the values, even one of spreadsheet day numbers', () => {
    const dayNumbers = previewCsv('Datum;Maß\n45234;24,99\n45235;25,01\n45236;24,98\n');
    expect(guessMapping(dayNumbers)).toMatchObject({ value: 1, period: 0 });
    const dated = previewCsv('Datum;Prüfer;Ergebnis\n03.11.2026;Meier;24,99\n04.11.2026;Meier;25,01\n');
    expect(guessMapping(dated)).toMatchObject({ value: 2, period: 0 });
    const grouped = previewCsv('Datum;Durchmesser;Stichprobe\n03.11.2026;24,99;1\n03.11.2026;25,01;1\n');
    expect(guessMapping(grouped)).toMatchObject({ value: 1, subgroup: 2, period: 0 });
  });

  it('reads one column of decimal-comma numbers as one column, with or without a header', () => {
    for (const text of ['Durchmesser\n24,995\n25,001\n24,998\n', '24,99\n25,01\n24,98\n', '1,234\n1,250\n']) {
      const p = previewCsv(text, { localeMark: '.' });
      expect(p.columns).toHaveLength(1);
      expect(p.decimal).toBe(',');
    }
    // Two columns named in a header stay two columns.
    expect(previewCsv('part,width\n1,24\n2,25\n').columns).toEqual(['part', 'width']);
  });
});
