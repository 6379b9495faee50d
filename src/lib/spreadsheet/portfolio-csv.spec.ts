import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { parseDemoPortfolio } from '../domain/demo-portfolio';
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

  it('writes a raw study value by value', () => {
    const raw = records.studies.find((s) => s.data.kind === 'raw')!;
    const parsed = Papa.parse<string[]>(studyCsv(raw, 'Width').trim()).data;
    expect(parsed[0]).toEqual(['characteristic', 'month', 'subgroup', 'value']);
    expect(parsed).toHaveLength((raw.data as { values: number[] }).values.length + 1);
  });
});
