import { analyzeDefectives, analyzeDefects } from '../lib/stats/analyze-counts';
import { integerFlag, numberFlag, parseArguments, rejectUnknown, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { toJson, toTable } from './figure-report';

const KNOWN = ['units', 'defectives', 'defects', 'opportunities', 'confidence', 'json', 'shift'];

export function countsCommand(argv: readonly string[], io: CliIo): number {
  const args = parseArguments(argv, ['json']);
  rejectUnknown(args, KNOWN, 'counts');
  const units = integerFlag(args, 'units');
  if (units === undefined) throw new UsageError('counts needs --units N');
  const defectives = integerFlag(args, 'defectives');
  const defects = integerFlag(args, 'defects');
  if ((defectives === undefined) === (defects === undefined))
    throw new UsageError('Give either --defectives D or --defects D');
  const opportunities = integerFlag(args, 'opportunities');
  if (opportunities !== undefined && defects === undefined)
    throw new UsageError('--opportunities goes with --defects');
  const confidence = numberFlag(args, 'confidence');
  const shift = numberFlag(args, 'shift');
  const options = {
    ...(confidence !== undefined ? { confidence } : {}),
    ...(shift !== undefined ? { shortTermShift: shift } : {})
  };
  const result =
    defectives !== undefined
      ? analyzeDefectives(units, defectives, options)
      : analyzeDefects(units, defects as number, opportunities ?? 1, options);
  io.stdout(args.flags.has('json') ? toJson(result) : toTable(result));
  return 0;
}
