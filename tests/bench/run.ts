/**
 * `npm run bench`: runs every benchmark and prints one table, each section's rows as soon as the section ends (a
 * full run takes minutes). Figures only; nothing here passes or fails.
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

const TABLE_HEAD = ['benchmark', 'time (ms)', 'baseline', 'baseline (ms)', 'ratio', 'peak MB', 'target'];
const tableLine = (cells: string[]) => `| ${cells.join(' | ')} |`;

function print(rows: BenchRow[]): void {
  for (const r of rows) {
    console.log(
      tableLine([
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

/** The benchmarks in the order they run and print: each section's rows are printed as soon as it ends. */
const SECTIONS: [string, () => BenchRow[] | Promise<BenchRow[]>][] = [
  ['engine', runEngineBench],
  ['CSV import', runCsvImportBench],
  ['master list', runMasterListBench],
  ['ranking and review', runRankingBench],
  ['command line', runCommandLineBench],
  ['exchange file', runExchangeFileBench],
  ['browser', runBrowserBench]
];

const json = process.argv.includes('--json');
let running: string | undefined = SECTIONS[0]![0];
// A section waiting on something that can never happen (a child or a browser gone without a word) leaves Node
// with nothing to do, and it ends (code 13) without a word of where: say which section.
process.on('beforeExit', () => {
  if (running === undefined) return;
  console.error(`bench: stopped while the ${running} section had not finished`);
  process.exitCode = 1;
  running = undefined;
});
if (!json) {
  console.log(`Capstan benchmarks — Node ${process.version}, ${new Date().toISOString()}`);
  console.log(tableLine(TABLE_HEAD));
  console.log(tableLine(['---', '---:', '---', '---:', '---:', '---:', '---']));
}
for (const [name, section] of SECTIONS) {
  running = name;
  (json ? printJson : print)(await section());
}
running = undefined;
