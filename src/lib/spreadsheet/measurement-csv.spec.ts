import { describe, expect, it } from 'vitest';
import { CsvInputError, detectDelimiter, readMeasurementCsv } from './measurement-csv';

describe('measurement CSV reading', () => {
  it('reads comma CSV with a header and picks the first numeric column', () => {
    const r = readMeasurementCsv('part,diameter\nA1,10.01\nA2,9.98\nA3,10.02\n');
    expect(r.values).toEqual([10.01, 9.98, 10.02]);
    expect(r.columnName).toBe('diameter');
    expect(r.delimiter).toBe(',');
  });

  it('reads semicolons with decimal commas (European exports)', () => {
    const r = readMeasurementCsv('Probe;Wert;Gruppe\n1;10,01;a\n2;9,98;a\n3;10,02;b\n', {
      column: 'Wert',
      subgroupColumn: 'Gruppe'
    });
    expect(r.values).toEqual([10.01, 9.98, 10.02]);
    expect(r.subgroups).toEqual(['a', 'a', 'b']);
    expect(r.decimal).toBe(',');
  });

  it('reads tab-separated text without a header, column by number', () => {
    const r = readMeasurementCsv('1\t5.5\n2\t5.7\n', { column: '2' });
    expect(r.hasHeader).toBe(false);
    expect(r.values).toEqual([5.5, 5.7]);
  });

  it('says which line and column hold a cell that is not a number', () => {
    expect(() => readMeasurementCsv('x,value\n1,2.5\n2,abc\n', { column: 'value' })).toThrow(
      new CsvInputError("Line 3, column 2 ('value'): 'abc' is not a number")
    );
    expect(() => readMeasurementCsv('value\n1\n\n2\n3,\n', {})).not.toThrow();
    expect(() => readMeasurementCsv('a;b\n1;\n', { column: 'b' })).toThrow(
      /Line 2, column 2 \('b'\): the value is empty/
    );
  });

  it('names the columns when the one asked for is missing, and refuses empty files', () => {
    expect(() => readMeasurementCsv('a,b\n1,2\n', { column: 'width' })).toThrow(
      "No value column 'width'; the columns are 'a', 'b'"
    );
    expect(() => readMeasurementCsv('   \n')).toThrow('The file is empty');
  });
});

describe('decimal commas in a one-column file', () => {
  it('reads a one-column file of decimal commas as one column', () => {
    const text = 'Wert\n0,213\n0,198\n0,207\n';
    expect(detectDelimiter(text)).toBe(';');
    expect(readMeasurementCsv(text).values).toEqual([0.213, 0.198, 0.207]);
  });
});
