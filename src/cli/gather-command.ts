import { readdir } from 'node:fs/promises';
import { join } from 'node:path';
import { summariseConflict } from '../lib/domain/conflict-summary';
import { countOf, PRINTED } from '../lib/domain/figure-format';
import { KIND_LABEL, type RecordsByKind } from '../lib/domain/record-kinds';
import { RecordIndex } from '../lib/domain/record-index';
import { gatherRecordSets, type GatherSource } from '../lib/domain/record-set-gather';
import { exchangeNamesIn } from '../lib/exchange/folder-names';
import { parseArguments, rejectUnknown, stringFlag, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { readExchangeBytes, readExchangeFile } from './exchange-file-input';
import { CONFLICT_EXIT, PREFER } from './merge-command';
import { mergedChangeSet, writeExchangeOutput } from './merged-output';

/** The header lists at most this many sources (the format's limit is 10); the rest are counted. */
const NAMED_SOURCES = 9;

/**
 * `gather FOLDER -o OUT [--prefer newer|base|incoming] [--strict] [--json]`: every exchange file in a shared
 * folder merged into one, with the app's merge rules. Names a sync service is still writing are skipped
 * (exchange/folder-names.ts); files are read in name order, so the listing order never matters, and `base`
 * and `incoming` mean the earlier and the later name. A damaged file is named on stderr and skipped (exit 0
 * if anything was merged; exit 2 with `--strict`, nothing written). Conflicts still open without `--prefer`:
 * exit 3, listed, nothing written. OUT is written under a temporary name and renamed, so a sync service never
 * carries half of it; it may lie in FOLDER, and gathering again then changes no record.
 */
export async function gatherCommand(argv: readonly string[], io: CliIo): Promise<number> {
  const normalised = argv.map((a) => (a === '-o' ? '--out' : a));
  const args = parseArguments(normalised, ['json', 'strict']);
  rejectUnknown(args, ['out', 'prefer', 'json', 'strict'], 'gather');
  const [folder, extra] = args.positional;
  const out = stringFlag(args, 'out');
  if (!folder || extra !== undefined || !out) {
    throw new UsageError(
      'gather needs a folder and an output: gather FOLDER -o OUT [--prefer newer|base|incoming] [--strict]'
    );
  }
  const preferText = stringFlag(args, 'prefer');
  if (preferText !== undefined && !(preferText in PREFER)) {
    throw new UsageError(`--prefer must be newer, base or incoming, got '${preferText}'`);
  }
  const rule = preferText === undefined ? undefined : PREFER[preferText];
  const strict = args.flags.has('strict');
  const json = args.flags.has('json');

  let names: string[];
  try {
    const entries = await readdir(folder, { withFileTypes: true });
    names = exchangeNamesIn(entries.filter((e) => e.isFile()).map((e) => e.name));
  } catch {
    throw new UsageError(`Cannot read the folder '${folder}'`);
  }

  const sources: GatherSource[] = [];
  const skipped: { name: string; problem: string }[] = [];
  // Each file is read while the one before it is checked: read one after the other, the main thread waited for
  // every file's bytes. The read's outcome is kept, so that a failed read is reported in its file's turn.
  const readOf = (name: string) =>
    readExchangeBytes(join(folder, name)).then(
      (bytes) => ({ bytes }),
      (error: unknown) => ({ error })
    );
  let reading = names.length > 0 ? readOf(names[0]!) : undefined;
  for (const [i, name] of names.entries()) {
    const read = await reading!;
    reading = i + 1 < names.length ? readOf(names[i + 1]!) : undefined;
    try {
      if ('error' in read) throw read.error;
      const changeSet = await readExchangeFile(join(folder, name), read.bytes);
      sources.push({ name, records: changeSet.records });
    } catch (error) {
      if (!(error instanceof UsageError)) throw error;
      const problem = error.message.replace(/^'[^']*':\s*/, '');
      skipped.push({ name, problem });
      io.stderr(`capstan gather: skipped '${name}': ${problem}`);
    }
  }
  if (strict && skipped.length > 0) {
    throw new UsageError(
      `${countOf(skipped.length, 'damaged file', 'damaged files', PRINTED)} in '${folder}' and --strict given: nothing was written`
    );
  }
  if (sources.length === 0) {
    throw new UsageError(
      skipped.length > 0
        ? `No exchange file in '${folder}' could be read: nothing was written`
        : `No exchange files in '${folder}' (names containing .capstan and ending in .json or .gz)`
    );
  }

  const gathered = gatherRecordSets(sources, rule);
  const lookup = gathered.conflicts.length > 0 ? lookupAcross(gathered.records, sources) : () => undefined;
  const conflicts = gathered.conflicts.map(({ source, conflict }) => {
    const summary = summariseConflict(conflict, lookup);
    return {
      source,
      kind: conflict.kind,
      id: conflict.key,
      type: conflict.type,
      title: summary.title,
      question: summary.question
    };
  });
  const report = {
    files: sources.map((s) => s.name),
    skipped,
    counts: gathered.counts
  };
  if (conflicts.length > 0) {
    if (json) io.stdout(JSON.stringify({ written: false, ...report, conflicts }, null, 2));
    else {
      io.stdout(
        [
          `${countOf(conflicts.length, 'conflict', 'conflicts', PRINTED)}: records changed on two devices since they last met. Nothing was written.`,
          ...conflicts.map(
            (c) => `  ${c.title} (${KIND_LABEL[c.kind]} ${c.id}, raised by ${c.source}): ${c.question}`
          ),
          gathered.refused
            ? `--prefer ${preferText} cannot settle them (${gathered.refused}): settle them in the app.`
            : 'Settle them in the app, or choose with --prefer newer (later edit wins), base or incoming.'
        ].join('\n')
      );
    }
    return CONFLICT_EXIT;
  }

  const changeSet = mergedChangeSet('gather', sourceList(sources.map((s) => s.name)), gathered.records);
  await writeExchangeOutput(out, changeSet);
  const total = Object.values(changeSet.header.counts).reduce((a, b) => a + b, 0);
  if (json) io.stdout(JSON.stringify({ written: true, out, ...report, records: total }, null, 2));
  else {
    io.stdout(
      `${out}: ${countOf(total, 'record', 'records', PRINTED)} from ${countOf(sources.length, 'file', 'files', PRINTED)}` +
        (skipped.length > 0
          ? `, ${countOf(skipped.length, 'damaged file', 'damaged files', PRINTED)} skipped`
          : '') +
        (gathered.counts.conflict > 0
          ? ` (${countOf(gathered.counts.conflict, 'conflict', 'conflicts', PRINTED)} settled: ${preferText})`
          : '')
    );
  }
  return 0;
}

function sourceList(names: readonly string[]): string[] {
  if (names.length <= NAMED_SOURCES + 1) return [...names];
  return [...names.slice(0, NAMED_SOURCES), `and ${names.length - NAMED_SOURCES} more files`];
}

/** Finds a record by id in the gathered result first, then in the sources (for naming conflicts). */
function lookupAcross(result: RecordsByKind, sources: readonly GatherSource[]) {
  const indexes = [new RecordIndex(result), ...sources.map((s) => new RecordIndex(s.records))];
  return (id: string) => {
    for (const index of indexes) {
      const r = index.record(id);
      if (r) return r;
    }
    return undefined;
  };
}
