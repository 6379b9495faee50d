/**
 * A master list of 20 000 rows through the steps the app's import takes — read (the worker), check against the
 * portfolio (the worker), build the records (the page, in chunks) — beside a bare Papa Parse of the same text as
 * baseline. Median of 3 runs. Prints only; the browser row in browser-bench.ts times the same in the built app.
 */
import Papa from 'papaparse';
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { planMasterList } from '../../src/lib/domain/master-list';
import { masterListRecords } from '../../src/lib/domain/master-list-records';
import { readMasterList } from '../../src/lib/spreadsheet/master-list-csv';
import type { BenchRow } from './engine-bench';
import { masterListText } from './master-list-rows';

function median3(fn: () => void): number {
  const out: number[] = [];
  fn();
  for (let i = 0; i < 3; i++) {
    const t0 = performance.now();
    fn();
    out.push(performance.now() - t0);
  }
  return out.sort((a, b) => a - b)[1]!;
}

export function runMasterListBench(rows = 20_000): BenchRow[] {
  const text = masterListText(rows);
  const empty = { sites: [], processes: [], characteristics: [] };
  let n = 0;
  const ctx = {
    deviceId: 'bench',
    now: () => new Date(),
    newId: () => `00000000-0000-4000-8000-${String(n++).padStart(12, '0')}`
  };
  const bare = median3(() => Papa.parse<string[]>(text, { delimiter: ',' }));
  const read = median3(() => readMasterList(text));
  const list = readMasterList(text);
  const plan = () =>
    planMasterList(list.rows, empty, BUILT_IN_PROFILES, { decimal: list.decimal, fromPeriod: '2026-11' });
  const planMs = median3(plan);
  const p = plan();
  if (p.badRows.length > 0) throw new Error(`bench list has bad rows: ${JSON.stringify(p.badRows[0])}`);
  const buildMs = median3(() => {
    const r = masterListRecords(p, empty, ctx);
    for (const chunk of r.characteristicChunks(1000)) n += chunk.length * 0;
  });
  return [
    {
      name: `master list of ${rows.toLocaleString('en')} rows: read (separator, decimal mark, columns)`,
      ms: read,
      baselineName: 'bare Papa Parse of the same text',
      baselineMs: bare
    },
    {
      name: `  … check every row and plan (${p.processes.create.length.toLocaleString('en')} processes, ${p.characteristics.create.length.toLocaleString('en')} characteristics)`,
      ms: planMs,
      baselineName: 'bare Papa Parse',
      baselineMs: bare
    },
    {
      name: '  … build and stamp the records (what the page does in 1 000-row chunks)',
      ms: buildMs,
      baselineName: 'bare Papa Parse',
      baselineMs: bare,
      target: 'read + check + commit < 10 s (browser row)'
    }
  ];
}
