import { describe, expect, it } from 'vitest';
import { MeasurementImportAccumulator } from './measurement-import';
import { periodFromCell } from './period-from-cell';

const chars = [
  { id: 'c-fill', name: 'Net fill weight' },
  { id: 'c-torque', name: 'Cap removal torque' }
];

describe('periods from cells', () => {
  it.each([
    ['2026-03', '2026-03'],
    ['2026-03-14', '2026-03'],
    ['14.03.2026', '2026-03'],
    ['2026/3/1', '2026-03'],
    ['2026-03-14 08:15', '2026-03']
  ])('%s → %s', (text, period) => expect(periodFromCell(text)).toBe(period));

  it('takes the month of a zoned timestamp in the site’s time zone', () => {
    expect(periodFromCell('2026-03-31T23:30:00Z', 'UTC')).toBe('2026-03');
    expect(periodFromCell('2026-03-31T23:30:00Z', 'Europe/Berlin')).toBe('2026-04');
  });

  it.each(['31.02.2026', '2026-13', 'March', ''])('refuses %j', (text) =>
    expect(periodFromCell(text)).toBeUndefined()
  );
});

describe('column mapping', () => {
  it('groups rows by characteristic (matched by name) and month, with subgroups', () => {
    const acc = new MeasurementImportAccumulator(
      { valueColumn: 2, characteristicColumn: 0, periodColumn: 1, subgroupColumn: 3 },
      { decimal: ',', characteristics: chars, timeZone: 'UTC' }
    );
    acc.addRow(['Net fill weight', '02.03.2026', '503,1', 'A'], 2);
    acc.addRow(['net  FILL weight', '2026-03-09', '502,4', 'B'], 3);
    acc.addRow(['Cap removal torque', '2026-04-01', '1,8', 'A'], 4);
    acc.addRow(['', '', '', ''], 5);
    const r = acc.result();
    expect(r.goodRows).toBe(3);
    expect(r.groups).toEqual([
      { characteristicId: 'c-fill', period: '2026-03', values: [503.1, 502.4], subgroups: ['A', 'B'] },
      { characteristicId: 'c-torque', period: '2026-04', values: [1.8], subgroups: ['A'] }
    ]);
  });

  it('lists each bad row by line with its reason', () => {
    const acc = new MeasurementImportAccumulator(
      { valueColumn: 1, characteristicColumn: 0 },
      { decimal: '.', defaultPeriod: '2026-05', characteristics: chars, timeZone: 'UTC' }
    );
    acc.addRow(['Net fill weight', '500.2'], 2);
    acc.addRow(['Net fill weight', 'n/a'], 3);
    acc.addRow(['Lid colour', '1'], 4);
    acc.addRow(['Net fill weight'], 5);
    const r = acc.result();
    expect(r.badRows).toEqual([
      { line: 3, reason: "column 2: 'n/a' is not a number" },
      { line: 4, reason: "column 1: no characteristic named 'Lid colour' at this site" },
      { line: 5, reason: 'column 2: the value is empty' }
    ]);
    expect(r.badCount).toBe(3);
    expect(r.goodRows).toBe(1);
  });

  it('needs a period and a characteristic from somewhere', () => {
    expect(
      () =>
        new MeasurementImportAccumulator(
          { valueColumn: 0 },
          { decimal: '.', characteristics: chars, timeZone: 'UTC', defaultCharacteristicId: 'c-fill' }
        )
    ).toThrow(/period column or a month/);
    expect(
      () =>
        new MeasurementImportAccumulator(
          { valueColumn: 0 },
          { decimal: '.', characteristics: chars, timeZone: 'UTC', defaultPeriod: '2026-01' }
        )
    ).toThrow(/characteristic column or one characteristic/);
  });
});
