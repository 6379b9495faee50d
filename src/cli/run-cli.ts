import { CsvInputError } from '../lib/spreadsheet/csv-input-error';
import { UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { MODELS } from './model-choices';

type Command = (args: string[], io: CliIo) => number | Promise<number>;

/**
 * Each command's module, loaded when the command runs: the usage text (and a mistyped command) then starts
 * without loading the analyses, zod, jStat or Papa Parse — loading them all was half of the command line's start.
 */
const COMMANDS: Record<string, () => Promise<Command>> = {
  analyze: async () => (await import('./analyze-command')).analyzeCommand,
  counts: async () => (await import('./counts-command')).countsCommand,
  convert: async () => (await import('./convert-command')).convertCommand,
  rank: async () => (await import('./rank-command')).rankCommand,
  check: async () => (await import('./check-command')).checkCommand,
  merge: async () => (await import('./merge-command')).mergeCommand,
  gather: async () => (await import('./gather-command')).gatherCommand,
  portfolio: async () => (await import('./portfolio-command')).portfolioCommand
};

/** The commands that read or write exchange files (main.ts gives them Node's hash and the compiled schema). */
export const EXCHANGE_COMMANDS: ReadonlySet<string> = new Set([
  'rank',
  'check',
  'merge',
  'gather',
  'portfolio'
]);

/**
 * The commands whose first argument, when it is not an option, is the exchange file they read first: main.ts starts
 * reading it while the command's modules load (shared-file-read.ts). A guess that names no file costs nothing.
 */
export const FILE_FIRST_COMMANDS: ReadonlySet<string> = new Set(['rank', 'check', 'merge']);

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
    if (command === undefined || command === 'help' || command === '--help') {
      io.stdout(USAGE);
      return command === undefined ? 2 : 0;
    }
    const load = Object.hasOwn(COMMANDS, command) ? COMMANDS[command] : undefined;
    if (!load)
      throw new UsageError(
        `Unknown command '${command}'; use ${Object.keys(COMMANDS).slice(0, -1).join(', ')} or ${Object.keys(COMMANDS).at(-1)} (help lists them)`
      );
    return await (
      await load()
    )(rest, io);
  } catch (error) {
    if (error instanceof UsageError || error instanceof CsvInputError || error instanceof RangeError) {
      io.stderr(`capstan ${command ?? ''}: ${error.message}`.replace(/\s+:/, ':'));
      return 2;
    }
    throw error;
  }
}
