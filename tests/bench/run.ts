/**
 * `npm run bench`: runs every benchmark and prints one table. Figures only; nothing here passes or fails.
 * `npm run bench -- --json` prints one JSON object per row instead (name, size, ms, baselineMs, ratio, peakMB),
 * one per line, for tools that compare runs.
 */
import { runBrowserBench } from './browser-bench';
import { runCommandLineBench } from './command-line-bench';
import { runCsvImportBench } from './csv-import-bench';
import { runExchangeFileBench } from './exchange-file-bench';
import { runEngineBench, type BenchRow } from './engine-bench';
import { runMasterListBench } from './master-list-bench';
import { runRankingBench } from './ranking-bench';

function printJson(rows: BenchRow[]): void {
  for (const r of rows)
    console.log(
      JSON.stringify({
        name: r.name,
        size: r.size ?? null,
        ms: Number.isFinite(r.ms) ? r.ms : null,
        baselineMs: r.baselineMs ?? null,
        ratio: r.baselineMs !== undefined ? r.ms / r.baselineMs : null,
        peakMB: r.peakMB ?? null
      })
    );
}

function print(rows: BenchRow[]): void {
  const line = (cells: string[]) => `| ${cells.join(' | ')} |`;
  console.log(line(['benchmark', 'time (ms)', 'baseline', 'baseline (ms)', 'ratio', 'peak MB', 'target']));
  console.log(line(['---', '---:', '---', '---:', '---:', '---:', '---']));
  for (const r of rows) {
    console.log(
      line([
        r.name,
        r.ms.toFixed(1),
        r.baselineName ?? '–',
        r.baselineMs !== undefined ? r.baselineMs.toFixed(1) : '–',
        r.baselineMs !== undefined ? `${(r.ms / r.baselineMs).toFixed(2)}×` : '–',
        r.peakMB !== undefined ? r.peakMB.toFixed(0) : '–',
        r.target ?? '–'
      ])
    );
  }
}

const json = process.argv.includes('--json');
if (!json) console.log(`Capstan benchmarks — Node ${process.version}, ${new Date().toISOString()}`);
(json ? printJson : print)([
  ...runEngineBench(),
  ...runCsvImportBench(),
  ...runMasterListBench(),
  ...(await runRankingBench()),
  ...(await runCommandLineBench()),
  ...(await runExchangeFileBench()),
  ...(await runBrowserBench())
]);
