/** `npm run bench`: runs every benchmark and prints one table. Figures only; nothing here passes or fails. */
import { runBrowserBench } from './browser-bench';
import { runCsvImportBench } from './csv-import-bench';
import { runExchangeFileBench } from './exchange-file-bench';
import { runEngineBench, type BenchRow } from './engine-bench';
import { runMasterListBench } from './master-list-bench';
import { runRankingBench } from './ranking-bench';
import { runReviewBench } from './review-bench';

function print(rows: BenchRow[]): void {
  const line = (cells: string[]) => `| ${cells.join(' | ')} |`;
  console.log(line(['benchmark', 'time (ms)', 'baseline', 'baseline (ms)', 'ratio', 'target']));
  console.log(line(['---', '---:', '---', '---:', '---:', '---']));
  for (const r of rows) {
    console.log(
      line([
        r.name,
        r.ms.toFixed(1),
        r.baselineName ?? '–',
        r.baselineMs !== undefined ? r.baselineMs.toFixed(1) : '–',
        r.baselineMs !== undefined ? `${(r.ms / r.baselineMs).toFixed(2)}×` : '–',
        r.target ?? '–'
      ])
    );
  }
}

console.log(`Capstan benchmarks — Node ${process.version}, ${new Date().toISOString()}`);
print([
  ...runEngineBench(),
  ...runCsvImportBench(),
  ...runMasterListBench(),
  ...runRankingBench(),
  ...runReviewBench(),
  ...(await runExchangeFileBench()),
  ...(await runBrowserBench())
]);
