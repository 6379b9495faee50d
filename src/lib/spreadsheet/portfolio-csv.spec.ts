import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { parseDemoPortfolio } from '../domain/demo-portfolio-schema';
import { rankPortfolio } from '../domain/portfolio-ranking';
import { portfolioCsv } from './portfolio-csv';
import { studyCsv } from './study-csv';

describe('portfolio and study CSV', () => {
  const records = parseDemoPortfolio(demo).records;
  it('writes one row per ranked process in rank order', () => {
    const rows = rankPortfolio(records, BUILT_IN_PROFILES, { endPeriod: '2026-09', windowMonths: 3 });
    const parsed = Papa.parse<string[]>(
      portfolioCsv(rows, { endPeriod: '2026-09', windowMonths: 3 }).trim()
    ).data;
    expect(parsed).toHaveLength(rows.length + 1);
    expect(parsed[1]?.[1]).toBe(rows[0]?.process.name);
    expect(parsed[1]?.[0]).toBe('1');
  });

  it('writes its figures by the figure policy: no scientific notation, no 17-digit floats, numbers stay numbers', () => {
    const rows = rankPortfolio(records, BUILT_IN_PROFILES, { endPeriod: '2026-09', windowMonths: 3 });
    const [header, ...body] = Papa.parse<string[]>(
      portfolioCsv(rows, { endPeriod: '2026-09', windowMonths: 3 }).trim()
    ).data;
    const column = (name: string) => body.map((r) => r[header!.indexOf(name)]!);
    for (const cell of body.flat()) {
      expect(cell).not.toMatch(/\d[eE][+-]?\d/);
      expect(cell).not.toMatch(/\.\d{8,}/);
    }
    // z-levels to 2 decimals, as on the page; the row's value, rounded, is what the cell says.
    const z = column('z-level (as reported)');
    expect(z.filter((c) => c !== '').every((c) => /^-?\d+\.\d\d$/.test(c))).toBe(true);
    rows.forEach((r, i) => {
      if (r.zLevel !== undefined) expect(Number(z[i])).toBeCloseTo(r.zLevel, 2);
      if (r.yield !== undefined) expect(Math.abs(Number(column('yield')[i]) - r.yield)).toBeLessThan(1e-3);
    });
    // ppm grouped on the page, plain here: a spreadsheet reads 2865, not "2,865".
    expect(column('ppm').every((c) => !c.includes(','))).toBe(true);
  });

  it('writes a raw study value by value', () => {
    const raw = records.studies.find((s) => s.data.kind === 'raw')!;
    const parsed = Papa.parse<string[]>(studyCsv(raw, 'Width').trim()).data;
    expect(parsed[0]).toEqual(['characteristic', 'month', 'subgroup', 'value']);
    expect(parsed).toHaveLength((raw.data as { values: number[] }).values.length + 1);
  });
});
