import { readFile } from 'node:fs/promises';
import { readMeasurementCsv } from '../lib/spreadsheet/measurement-csv';
import { analyzeMeasured, type ModelChoice } from '../lib/stats/analyze-measured';
import { MODELS } from './model-choices';
import type { SigmaEstimator } from '../lib/stats/sigma-estimators';
import {
  integerFlag,
  numberFlag,
  parseArguments,
  rejectUnknown,
  stringFlag,
  UsageError
} from './cli-arguments';
import { toJson, toTable } from './figure-report';
import type { CliIo } from './cli-io';
import { resolutionOf } from '../lib/domain/figure-format';

const ESTIMATORS: SigmaEstimator[] = ['rbar', 'sbar', 'pooled', 'moving-range'];
const KNOWN = [
  'lsl',
  'usl',
  'target',
  'subgroup-size',
  'subgroup-column',
  'model',
  'confidence',
  'column',
  'json',
  'estimator',
  'delimiter',
  'decimal',
  'shift',
  'min-index'
];

export async function analyzeCommand(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseArguments(argv, ['json']);
  rejectUnknown(args, KNOWN, 'analyze');
  const file = args.positional[0];
  if (!file) throw new UsageError('analyze needs a CSV file: analyze FILE.csv --lsl L --usl U');
  const lsl = numberFlag(args, 'lsl');
  const usl = numberFlag(args, 'usl');
  if (lsl === undefined && usl === undefined)
    throw new UsageError('Give at least one limit: --lsl and/or --usl');
  if (lsl !== undefined && usl !== undefined && !(lsl < usl))
    throw new UsageError(`--lsl (${lsl}) must be less than --usl (${usl})`);
  const model = (stringFlag(args, 'model') ?? 'auto') as ModelChoice;
  if (!MODELS.includes(model))
    throw new UsageError(`--model must be one of ${MODELS.join(', ')}; got '${model}'`);
  const estimator = stringFlag(args, 'estimator') as SigmaEstimator | undefined;
  if (estimator !== undefined && !ESTIMATORS.includes(estimator))
    throw new UsageError(`--estimator must be one of ${ESTIMATORS.join(', ')}`);
  const subgroupSize = integerFlag(args, 'subgroup-size');
  const subgroupColumn = stringFlag(args, 'subgroup-column');
  if (subgroupSize !== undefined && subgroupColumn !== undefined)
    throw new UsageError('Give --subgroup-size or --subgroup-column, not both');
  const delimiterFlag = stringFlag(args, 'delimiter');
  const delimiter = delimiterFlag === undefined ? 'auto' : delimiterFlag === 'tab' ? '\t' : delimiterFlag;
  if (![',', ';', '\t', 'auto'].includes(delimiter))
    throw new UsageError("--delimiter must be ',', ';' or tab");
  const decimal = stringFlag(args, 'decimal') ?? 'auto';
  if (!['.', ',', 'auto'].includes(decimal)) throw new UsageError("--decimal must be '.' or ','");
  const target = numberFlag(args, 'target');
  const confidence = numberFlag(args, 'confidence');
  const shift = numberFlag(args, 'shift');
  const minIndex = numberFlag(args, 'min-index');

  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    throw new UsageError(`Cannot read '${file}': no such file or not readable`);
  }
  const csv = readMeasurementCsv(text, {
    delimiter: delimiter as ',' | ';' | '\t' | 'auto',
    decimal: decimal as '.' | ',' | 'auto',
    ...(stringFlag(args, 'column') !== undefined ? { column: stringFlag(args, 'column') as string } : {}),
    ...(subgroupColumn !== undefined ? { subgroupColumn } : {})
  });
  if (csv.values.length < 2)
    throw new UsageError(`'${file}' holds ${csv.values.length} value; at least 2 are needed`);
  const result = analyzeMeasured(csv.values, {
    spec: {
      ...(lsl !== undefined ? { lsl } : {}),
      ...(usl !== undefined ? { usl } : {}),
      ...(target !== undefined ? { target } : {})
    },
    ...(csv.subgroups ? { subgroups: csv.subgroups } : {}),
    ...(subgroupSize !== undefined ? { subgroupSize } : {}),
    ...(estimator ? { estimator } : {}),
    model,
    ...(confidence !== undefined ? { confidence } : {}),
    ...(shift !== undefined ? { shortTermShift: shift } : {}),
    ...(minIndex !== undefined ? { requiredIndex: minIndex } : {})
  });
  io.stdout(
    args.flags.has('json')
      ? toJson(result)
      : `${csv.columnName} from ${file}\n${toTable(result, resolutionOf(csv.values))}`
  );
  return 0;
}
