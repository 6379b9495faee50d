import { describe, expect, it } from 'vitest';
import { parsePastedValues } from './pasted-values';

describe('pasted and typed measurements', () => {
  it('reads one value per line, spaces or semicolons, and decimal commas', () => {
    expect(parsePastedValues('10.1\n10.2\n\n9.9').values).toEqual([10.1, 10.2, 9.9]);
    expect(parsePastedValues('10,1 10,2\n9,9').values).toEqual([10.1, 10.2, 9.9]);
    expect(parsePastedValues('10,1;10,2;9,9').values).toEqual([10.1, 10.2, 9.9]);
  });

  it('reads spreadsheet cells with a header row: subgroup and value columns', () => {
    const block = 'Subgroup\tDiameter\n1\t10,01\n1\t9,98\n2\t10,03\n';
    const r = parsePastedValues(block);
    expect(r.header).toEqual(['Subgroup', 'Diameter']);
    expect(r.values).toEqual([10.01, 9.98, 10.03]);
    expect(r.subgroups).toEqual(['1', '1', '2']);
    expect(r.problems).toEqual([]);
  });

  it('takes the last numeric column as values when a label column follows', () => {
    const r = parsePastedValues('S1\t5.5\tok\nS1\t5.6\tok\nS2\t5.4\tcheck\n');
    expect(r.values).toEqual([5.5, 5.6, 5.4]);
    expect(r.subgroups).toEqual(['S1', 'S1', 'S2']);
    expect(r.header).toBeUndefined();
  });

  it('lists cells that are not numbers by line', () => {
    const r = parsePastedValues('Value\n1.5\nabc\n2.5\n');
    expect(r.values).toEqual([1.5, 2.5]);
    expect(r.problems).toEqual([{ line: 3, message: "'abc' is not a number" }]);
  });
});
