import { BUILT_IN_PROFILES } from '../lib/domain/context-profile';
import { parseDemoPortfolio } from '../lib/domain/demo-portfolio-schema';
import { isPeriod, periodsOfQuarter } from '../lib/domain/period';
import { ValidationError } from '../lib/domain/validation-error';
import { EXCHANGE_FORMAT } from '../lib/exchange/exchange-schema';
import { integerFlag, parseArguments, rejectUnknown, stringFlag, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { readExchangeFile } from './exchange-file-input';
import { rankInputOfExchange, rankReport, type RankRequest } from './rank-report';
import { readFileShared } from './shared-file-read';

const KNOWN = ['period', 'quarter', 'window', 'json'];

export async function rankCommand(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseArguments(argv, ['json']);
  rejectUnknown(args, KNOWN, 'rank');
  const file = args.positional[0];
  if (!file)
    throw new UsageError(
      'rank needs a portfolio file: rank FILE [--period YYYY-MM | --quarter YYYY-Qn] [--window months]'
    );
  const period = stringFlag(args, 'period');
  const quarter = stringFlag(args, 'quarter');
  if (period !== undefined && quarter !== undefined)
    throw new UsageError('Give --period or --quarter, not both');
  if (period !== undefined && !isPeriod(period))
    throw new UsageError(`--period must be a month written YYYY-MM, got '${period}'`);
  let quarterMonths: string[] | undefined;
  if (quarter !== undefined) {
    try {
      quarterMonths = periodsOfQuarter(quarter);
    } catch {
      throw new UsageError(`--quarter must be written YYYY-Qn, got '${quarter}'`);
    }
  }
  const window = integerFlag(args, 'window') ?? (quarterMonths ? 3 : 1);
  if (window < 1 || window > 120)
    throw new UsageError(`--window must be between 1 and 120 months, got ${window}`);
  const endPeriod = period ?? quarterMonths?.[2];
  const report = await reportOfFile(file, {
    ...(endPeriod !== undefined ? { endPeriod } : {}),
    windowMonths: window,
    json: args.flags.has('json')
  });
  if (report === undefined) throw new UsageError(`'${file}' holds no studies to rank`);
  io.stdout(report);
  return 0;
}

const EXCHANGE_START = new RegExp(`^\\uFEFF?\\s*\\{\\s*"format"\\s*:\\s*"${EXCHANGE_FORMAT}"`);

/**
 * What `rank` prints for an exchange file (gzip or not; tombstones left out, its context profiles laid over the
 * built-in ones) or the demo portfolio file; undefined when it holds no study and no month was given.
 */
async function reportOfFile(file: string, request: RankRequest): Promise<string | undefined> {
  const bytes = await readFileShared(file);
  const gzip = bytes[0] === 0x1f && bytes[1] === 0x8b;
  let json: unknown;
  // An exchange file as written (or re-indented) starts with its format: read it once, by the exchange reader,
  // rather than parsing 30 MB here first only to learn what it is. Anything else is parsed to find out.
  if (!gzip && !EXCHANGE_START.test(bytes.subarray(0, 200).toString('utf8'))) {
    try {
      json = JSON.parse(bytes.toString('utf8'));
    } catch (error) {
      throw new UsageError(`'${file}' is not JSON: ${(error as Error).message}`);
    }
  }
  if (json === undefined || (json as { format?: unknown } | null)?.format === EXCHANGE_FORMAT) {
    const { records } = await readExchangeFile(file, bytes);
    return rankReport(rankInputOfExchange(records), request);
  }
  try {
    return rankReport({ records: parseDemoPortfolio(json).records, profiles: BUILT_IN_PROFILES }, request);
  } catch (error) {
    if (error instanceof ValidationError)
      throw new UsageError(
        `'${file}' is not a portfolio file: ${error.problems[0]?.field} — ${error.problems[0]?.message}`
      );
    throw error;
  }
}
