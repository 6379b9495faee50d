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
