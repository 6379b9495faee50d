/// <reference lib="webworker" />
/**
 * Reads a measurement file in the background so that a file of a million rows never freezes the page: Papa
 * Parse streams it in 1 MB chunks, each row goes through the import accumulator, progress is posted after each
 * chunk. Nothing is written here; the page commits the result in one transaction, or drops it. Cancelling
 * terminates this worker, which leaves nothing behind.
 */
import Papa from 'papaparse';
import {
  MeasurementImportAccumulator,
  type ImportContext,
  type ImportMapping
} from '../spreadsheet/measurement-import';

export interface ImportRequest {
  file: File;
  delimiter: ',' | ';' | '\t';
  hasHeader: boolean;
  mapping: ImportMapping;
  context: ImportContext;
}

export type ImportMessage =
  | { type: 'progress'; fraction: number; rows: number }
  | {
      type: 'done';
      groups: { characteristicId: string; period: string; values: Float64Array; subgroups?: string[] }[];
      goodRows: number;
      badRows: { line: number; reason: string }[];
      badCount: number;
    }
  | { type: 'error'; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (event: MessageEvent<ImportRequest>) => {
  const { file, delimiter, hasHeader, mapping, context } = event.data;
  let accumulator: MeasurementImportAccumulator;
  try {
    accumulator = new MeasurementImportAccumulator(mapping, context);
  } catch (error) {
    scope.postMessage({ type: 'error', message: (error as Error).message } satisfies ImportMessage);
    return;
  }
  let line = 0;
  Papa.parse<string[]>(file, {
    delimiter,
    chunkSize: 1 << 20,
    skipEmptyLines: false,
    chunk: (results) => {
      for (const row of results.data) {
        line += 1;
        if (line === 1 && hasHeader) continue;
        accumulator.addRow(row, line);
      }
      scope.postMessage({
        type: 'progress',
        fraction: Math.min(1, results.meta.cursor / Math.max(1, file.size)),
        rows: line
      } satisfies ImportMessage);
    },
    complete: () => {
      const r = accumulator.result();
      const groups = r.groups.map((g) => ({ ...g, values: Float64Array.from(g.values) }));
      const message: ImportMessage = {
        type: 'done',
        groups,
        goodRows: r.goodRows,
        badRows: r.badRows,
        badCount: r.badCount
      };
      scope.postMessage(
        message,
        groups.map((g) => g.values.buffer)
      );
    },
    error: (error) =>
      scope.postMessage({
        type: 'error',
        message: `The file could not be read: ${error.message}`
      } satisfies ImportMessage)
  });
};
