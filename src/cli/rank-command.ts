import { effectiveProfiles } from '../lib/domain/context-profile-record';
import { isLive } from '../lib/domain/record-meta';
import { EXCHANGE_FORMAT } from '../lib/exchange/exchange-schema';
import { readExchangeFile } from './exchange-file-input';
import { readFileShared } from './shared-file-read';
import { BUILT_IN_PROFILES } from '../lib/domain/context-profile';
import { parseDemoPortfolio } from '../lib/domain/demo-portfolio-schema';
import { isPeriod, periodsOfQuarter } from '../lib/domain/period';
import { countOf, formatCount, formatIndex, PRINTED } from '../lib/domain/figure-format';
import {
  portfolioColumn,
  portfolioRowObject,
  writtenCell,
  zWithBasis,
  type PortfolioColumnKey
} from '../lib/domain/portfolio-columns';
import { rankPortfolio } from '../lib/domain/portfolio-ranking';
import { ValidationError } from '../lib/domain/validation-error';
import { integerFlag, parseArguments, rejectUnknown, stringFlag, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';

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
  const { records, profiles } = await readPortfolio(file);
  const latest = records.studies.reduce((a, s) => (s.period > a ? s.period : a), '');
  const endPeriod = period ?? quarterMonths?.[2] ?? latest;
  if (!endPeriod) throw new UsageError(`'${file}' holds no studies to rank`);
  const json = args.flags.has('json');
  // The table printed has no trend column: its rows are ranked without trend lines (the JSON has their slope).
  const rows = rankPortfolio(records, profiles, {
    endPeriod,
    windowMonths: window,
    ...(json ? {} : { trendMonths: 0 })
  });
  if (json) {
    // One object per row keyed by the portfolio's column keys (domain/portfolio-columns.ts).
    const out = rows.map((r, i) => portfolioRowObject(r, i + 1));
    io.stdout(
      JSON.stringify(
        { endPeriod, windowMonths: window, rows: out },
        (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v),
        2
      )
    );
    return 0;
  }
  const lines = [
    `Portfolio for the ${countOf(window, 'month', 'months', PRINTED)} ending ${endPeriod} (${countOf(rows.length, 'process', 'processes', PRINTED)}), highest priority first`,
    ''
  ];
  const printed: PortfolioColumnKey[] = [
    'rank',
    'priority',
    'status',
    'zLevel',
    'zGap',
    'costPerYear',
    'process',
    'site',
    'weakest'
  ];
  lines.push(printed.map((k) => (k === 'zLevel' ? 'z-level (LT/ST)' : portfolioColumn(k).label)).join('\t'));
  rows.forEach((row, i) => {
    lines.push(
      printed
        .map((k) => {
          if (k === 'zLevel') return zWithBasis(row, (z) => formatIndex(z, PRINTED));
          if (k === 'costPerYear')
            return row.costPerYear === undefined
              ? '–'
              : `${formatCount(row.costPerYear, PRINTED)} ${row.process.currency}`;
          return writtenCell(portfolioColumn(k), row, i + 1, PRINTED) || '–';
        })
        .join('\t')
    );
  });
  lines.push(
    '',
    profiles === BUILT_IN_PROFILES
      ? 'Targets are the built-in context defaults; customer-specific and regulatory requirements prevail.'
      : "Targets are the file's context profiles over the built-in defaults; customer-specific and regulatory requirements prevail."
  );
  io.stdout(lines.join('\n'));
  return 0;
}

const EXCHANGE_START = new RegExp(`^\\uFEFF?\\s*\\{\\s*"format"\\s*:\\s*"${EXCHANGE_FORMAT}"`);

/**
 * Reads an exchange file (gzip or not; tombstones left out, its context profiles laid over the built-in ones)
 * or the demo portfolio file.
 */
async function readPortfolio(file: string) {
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
    return {
      records: {
        sites: records.sites.filter(isLive),
        processes: records.processes.filter(isLive),
        characteristics: records.characteristics.filter(isLive),
        studies: records.studies.filter(isLive),
        projects: records.projects.filter(isLive)
      },
      profiles:
        records.contextProfiles.length > 0
          ? effectiveProfiles(BUILT_IN_PROFILES, records.contextProfiles)
          : BUILT_IN_PROFILES
    };
  }
  try {
    return { records: parseDemoPortfolio(json).records, profiles: BUILT_IN_PROFILES };
  } catch (error) {
    if (error instanceof ValidationError)
      throw new UsageError(
        `'${file}' is not a portfolio file: ${error.problems[0]?.field} — ${error.problems[0]?.message}`
      );
    throw error;
  }
}
