import { randomUUID } from 'node:crypto';
import { readFile, writeFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { BUILT_IN_PROFILES } from '../lib/domain/context-profile';
import { HybridClock } from '../lib/domain/hybrid-clock';
import { masterListCounts, planMasterList } from '../lib/domain/master-list';
import { masterListRecords } from '../lib/domain/master-list-records';
import { isPeriod, periodOf } from '../lib/domain/period';
import { emptyRecords } from '../lib/domain/record-kinds';
import { changeSetOf, encodeExchangeFile } from '../lib/exchange/exchange-file';
import { readMasterList } from '../lib/spreadsheet/master-list-csv';
import { parseArguments, rejectUnknown, stringFlag, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { countOf, PRINTED } from '../lib/domain/figure-format';

declare const __APP_VERSION__: string | undefined;

/**
 * `portfolio LIST.csv -o OUT.capstan.json [--delimiter ,|;|tab] [--decimal .|,] [--from YYYY-MM] [--json]`:
 * a master list (one row per characteristic) turned into an exchange file, so that an office can set up every
 * site by sending one file. The rows are read and checked by the same code as the app's master-list import
 * (spreadsheet/master-list-csv.ts, domain/master-list.ts), against the built-in industry contexts. Any bad row
 * means exit 2, every bad line named with its reasons on stderr, and nothing written.
 */
export async function portfolioCommand(argv: readonly string[], io: CliIo): Promise<number> {
  const normalised = argv.map((a) => (a === '-o' ? '--out' : a));
  const args = parseArguments(normalised, ['json']);
  rejectUnknown(args, ['out', 'delimiter', 'decimal', 'from', 'json'], 'portfolio');
  const [path, extra] = args.positional;
  const out = stringFlag(args, 'out');
  if (!path || extra !== undefined || !out)
    throw new UsageError(
      'portfolio needs a master list and an output: portfolio LIST.csv -o OUT.capstan.json'
    );
  const delimiterFlag = stringFlag(args, 'delimiter');
  const delimiter = delimiterFlag === 'tab' ? '\t' : delimiterFlag;
  if (delimiter !== undefined && ![',', ';', '\t'].includes(delimiter))
    throw new UsageError("--delimiter must be ',', ';' or tab");
  const decimal = stringFlag(args, 'decimal');
  if (decimal !== undefined && !['.', ','].includes(decimal))
    throw new UsageError("--decimal must be '.' or ','");
  const from = stringFlag(args, 'from') ?? periodOf(new Date());
  if (!isPeriod(from)) throw new UsageError(`--from must be a month written YYYY-MM, got '${from}'`);

  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new UsageError(`Cannot read '${path}': no such file or not readable`);
  }
  const list = readMasterList(text, {
    ...(delimiter ? { delimiter: delimiter as ',' | ';' | '\t' } : {}),
    ...(decimal ? { decimal: decimal as '.' | ',' } : {})
  });
  if (list.missing.length > 0)
    throw new UsageError(
      `${basename(path)} has no column for ${list.missing.join(', ')} (header row: ${list.header.join(' | ') || 'empty'})`
    );
  if (list.rows.length === 0) throw new UsageError(`${basename(path)} has a header but no rows`);
  const empty = { sites: [], processes: [], characteristics: [] };
  const plan = planMasterList(list.rows, empty, BUILT_IN_PROFILES, {
    decimal: list.decimal,
    fromPeriod: from
  });
  const json = args.flags.has('json');
  if (plan.badRows.length > 0) {
    if (json) io.stdout(JSON.stringify({ written: false, badRows: plan.badRows }, null, 2));
    io.stderr(
      [
        `capstan portfolio: ${countOf(plan.badRows.length, 'bad row', 'bad rows', PRINTED)} in ${basename(path)}; nothing was written`,
        ...plan.badRows.map((b) => `  line ${b.line}: ${b.reasons.join('; ')}`)
      ].join('\n')
    );
    return 2;
  }

  // The command line is a device of its own for this run: a fresh id, its own clock.
  const deviceId = randomUUID();
  const clock = new HybridClock(deviceId);
  const built = masterListRecords(plan, empty, {
    deviceId,
    now: () => new Date(),
    newId: () => randomUUID(),
    clock
  });
  const records = emptyRecords();
  records.sites = built.sites;
  records.processes = built.processes;
  records.characteristics = [...built.characteristicChunks(5000)].flat();
  const changeSet = changeSetOf(
    {
      appVersion: typeof __APP_VERSION__ === 'string' ? __APP_VERSION__ : 'command-line',
      exportedBy: { deviceId, deviceName: 'capstan portfolio' },
      exportedAt: new Date().toISOString(),
      scope: { kind: 'everything' }
    },
    records
  );
  try {
    await writeFile(out, await encodeExchangeFile(changeSet, { gzip: out.endsWith('.gz') }));
  } catch {
    throw new UsageError(`Cannot write '${out}'`);
  }
  const c = masterListCounts(plan);
  if (json)
    io.stdout(
      JSON.stringify(
        { written: true, out, counts: c, delimiter: list.delimiter, decimal: list.decimal },
        null,
        2
      )
    );
  else
    io.stdout(
      `${out}: ${countOf(c.newSites, 'site', 'sites', PRINTED)}, ${countOf(c.newProcesses, 'process', 'processes', PRINTED)}, ${countOf(c.newCharacteristics, 'characteristic', 'characteristics', PRINTED)} ` +
        `(separator ${list.delimiter === '\t' ? 'tab' : `'${list.delimiter}'`}, decimal mark '${list.decimal}')`
    );
  return 0;
}
