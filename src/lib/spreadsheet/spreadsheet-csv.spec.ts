import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvCell, toCsv } from './spreadsheet-csv';

describe('spreadsheet CSV', () => {
  it.each([
    ['=HYPERLINK("http://x")', `"'=HYPERLINK(""http://x"")"`],
    ['+1+1', "'+1+1"],
    ['-2', "'-2"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['plain', 'plain'],
    ['a,b', '"a,b"']
  ])('neutralises and quotes %j', (input, output) => {
    expect(csvCell(input)).toBe(output);
  });

  it('keeps numbers as numbers, negative ones included, and reads back with a CSV parser', () => {
    expect(csvCell(-2.5)).toBe('-2.5');
    const text = toCsv([
      ['name', 'value'],
      ['line "A"\nsecond', -1],
      ['=cmd', 3]
    ]);
    expect(Papa.parse<string[]>(text.trim()).data).toEqual([
      ['name', 'value'],
      ['line "A"\nsecond', '-1'],
      ["'=cmd", '3']
    ]);
  });
});
