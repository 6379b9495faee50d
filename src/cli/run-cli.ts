import { CsvInputError } from '../lib/spreadsheet/measurement-csv';
import { analyzeCommand, MODELS } from './analyze-command';
import { checkCommand } from './check-command';
import { gatherCommand } from './gather-command';
import { mergeCommand } from './merge-command';
import { UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { convertCommand } from './convert-command';
import { countsCommand } from './counts-command';
import { portfolioCommand } from './portfolio-command';
import { rankCommand } from './rank-command';

export const USAGE = `Capstan command line — capability figures with their assumptions

  analyze FILE.csv --lsl L --usl U [--target T] [--subgroup-size K | --subgroup-column NAME]
          [--estimator rbar|sbar|pooled|moving-range]
          [--model ${MODELS.join('|')}]
          [--confidence 0.95] [--column NAME] [--delimiter ,|;|tab] [--decimal .|,]
          [--shift 1.5] [--min-index 1.33] [--json]
  counts  --units N (--defectives D | --defects D [--opportunities O]) [--confidence 0.95] [--shift 1.5] [--json]
  convert (--ppm X | --yield Y | --z Z) [--shift 1.5] [--json]
  rank    FILE [--period YYYY-MM | --quarter YYYY-Qn] [--window months] [--json]
          (FILE: an exchange file or the demo portfolio file)
  check   FILE [--json]                      validate an exchange file; print its header and counts
  merge   BASE INCOMING -o OUT [--prefer newer|base|incoming] [--json]
  gather  FOLDER -o OUT [--prefer newer|base|incoming] [--strict] [--json]
          every exchange file in a shared sync folder merged into one (names still being written are skipped;
          a damaged file is named on stderr and skipped, or with --strict stops it)
  portfolio LIST.csv -o OUT.capstan.json [--delimiter ,|;|tab] [--decimal .|,] [--from YYYY-MM] [--json]
          a master list (one row per characteristic) as an exchange file for setting up every site

Exit 0 on success; 2 on bad input, with one line on stderr saying what and where (portfolio: one per bad row);
3 when merge or gather finds conflicts and no --prefer was given (nothing written).`;

/** Runs one command; returns the exit code. Bad input never throws out of here. */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const [command, ...rest] = argv;
  try {
    switch (command) {
      case 'analyze':
        return await analyzeCommand(rest, io);
      case 'counts':
        return countsCommand(rest, io);
      case 'convert':
        return convertCommand(rest, io);
      case 'rank':
        return await rankCommand(rest, io);
      case 'check':
        return await checkCommand(rest, io);
      case 'merge':
        return await mergeCommand(rest, io);
      case 'gather':
        return await gatherCommand(rest, io);
      case 'portfolio':
        return await portfolioCommand(rest, io);
      case undefined:
      case 'help':
      case '--help':
        io.stdout(USAGE);
        return command === undefined ? 2 : 0;
      default:
        throw new UsageError(
          `Unknown command '${command}'; use analyze, counts, convert, rank, check, merge, gather or portfolio (help lists them)`
        );
    }
  } catch (error) {
    if (error instanceof UsageError || error instanceof CsvInputError || error instanceof RangeError) {
      io.stderr(`capstan ${command ?? ''}: ${error.message}`.replace(/\s+:/, ':'));
      return 2;
    }
    throw error;
  }
}
