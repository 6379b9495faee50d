/**
 * Import of a 10⁶-row single-column CSV through the same path the import worker takes (Papa Parse in 1 MB
 * chunks, rows into the import accumulator), timed, with peak memory sampled after every chunk. Prints only.
 */
import Papa from 'papaparse';
import { MeasurementImportAccumulator } from '../../src/lib/spreadsheet/measurement-import';
import type { BenchRow } from './engine-bench';

export function runCsvImportBench(): BenchRow[] {
  const lines = ['thickness'];
  for (let i = 0; i < 1_000_000; i += 1)
    lines.push((100 + ((i * 7919) % 1000) / 100).toFixed(2).replace('.', ','));
  const text = lines.join('\n');
  const rssBefore = process.memoryUsage().rss;
  let peakRss = rssBefore;
  let peakHeap = process.memoryUsage().heapUsed;
  const t0 = performance.now();
  const acc = new MeasurementImportAccumulator(
    { valueColumn: 0 },
    {
      decimal: ',',
      defaultPeriod: '2027-01',
      defaultCharacteristicId: 'c',
      characteristics: [],
      timeZone: 'UTC'
    }
  );
  let line = 0;
  // Papa Parse streams strings in chunks too; its typings only declare `chunk` for files and URLs.
  const config = {
    delimiter: ';',
    chunkSize: 1 << 20,
    chunk: (results: Papa.ParseResult<string[]>) => {
      for (const row of results.data) {
        line += 1;
        if (line > 1) acc.addRow(row, line);
      }
      const m = process.memoryUsage();
      peakRss = Math.max(peakRss, m.rss);
      peakHeap = Math.max(peakHeap, m.heapUsed);
    }
  };
  Papa.parse<string[]>(text, config as Papa.ParseConfig<string[]>);
  const result = acc.result();
  const ms = performance.now() - t0;
  if (result.goodRows !== 1_000_000)
    throw new Error(`import read ${result.goodRows} rows, expected 1 000 000`);
  const mb = (b: number) => `${(b / 2 ** 20).toFixed(0)} MB`;
  return [
    {
      name: `CSV import, 10⁶ rows (${mb(text.length)} text), decimal commas; peak heap ${mb(peakHeap)}, RSS +${mb(peakRss - rssBefore)}`,
      ms,
      target: 'no freeze (runs in a worker)'
    }
  ];
}
