import { basename } from 'node:path';
import { KIND_LABEL, type RecordsByKind } from '../lib/domain/record-kinds';
import type { ConflictRule } from '../lib/domain/record-merge';
import { summariseConflict } from '../lib/domain/conflict-summary';
import { RecordIndex } from '../lib/domain/record-index';
import { mergeRecordSets } from '../lib/domain/record-set-merge';
import { MergeRefused } from '../lib/domain/change-set-merge';
import { parseArguments, rejectUnknown, stringFlag, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { readExchangeFile } from './exchange-file-input';
import { mergedChangeSet, writeExchangeOutput } from './merged-output';
import { countOf, PRINTED } from '../lib/domain/figure-format';

/** `--prefer` of `merge` and `gather`: which side a conflict keeps. */
export const PREFER: Record<string, ConflictRule> = { newer: 'newer', base: 'local', incoming: 'incoming' };

/** Exit code when conflicts stop a merge (no `--prefer`): distinct from bad input (2). */
export const CONFLICT_EXIT = 3;

/** Finds a record by id in the base file first, then in the incoming one (for naming conflicts). */
function lookupIn(base: RecordsByKind, incoming: RecordsByKind) {
  const a = new RecordIndex(base);
  const b = new RecordIndex(incoming);
  return (id: string) => a.record(id) ?? b.record(id);
}

/**
 * `merge BASE INCOMING -o OUT [--prefer newer|base|incoming] [--json]`: the app's merge rules applied to two
 * files. Without `--prefer`, a conflict stops the merge (exit 3, nothing written) and is listed.
 */
export async function mergeCommand(argv: readonly string[], io: CliIo): Promise<number> {
  const normalised = argv.map((a) => (a === '-o' ? '--out' : a));
  const args = parseArguments(normalised, ['json']);
  rejectUnknown(args, ['out', 'prefer', 'json'], 'merge');
  const [basePath, incomingPath, extra] = args.positional;
  const out = stringFlag(args, 'out');
  if (!basePath || !incomingPath || extra !== undefined || !out) {
    throw new UsageError(
      'merge needs two files and an output: merge BASE INCOMING -o OUT [--prefer newer|base|incoming]'
    );
  }
  const preferText = stringFlag(args, 'prefer');
  if (preferText !== undefined && !(preferText in PREFER)) {
    throw new UsageError(`--prefer must be newer, base or incoming, got '${preferText}'`);
  }
  const rule = preferText === undefined ? undefined : PREFER[preferText];
  const [base, incoming] = [await readExchangeFile(basePath), await readExchangeFile(incomingPath)];
  let merged: ReturnType<typeof mergeRecordSets>;
  try {
    merged = mergeRecordSets(base.records, incoming.records, rule);
  } catch (error) {
    // A rule that cannot settle (bringing a deleted parent back would leave a month with two studies).
    if (!(error instanceof MergeRefused)) throw error;
    io.stderr(
      `capstan merge: --prefer ${preferText} cannot settle the conflicts (${error.message}): settle them in the app`
    );
    return CONFLICT_EXIT;
  }
  const lookup = lookupIn(base.records, incoming.records);
  const conflicts = merged.conflicts.map((c) => {
    const summary = summariseConflict(c, lookup);
    return {
      kind: c.kind,
      id: c.key,
      type: c.type,
      nature: c.nature,
      fields: c.fields,
      title: summary.title,
      question: summary.question
    };
  });
  const json = args.flags.has('json');
  if (conflicts.length > 0 && !rule) {
    if (json) io.stdout(JSON.stringify({ written: false, counts: merged.counts, conflicts }, null, 2));
    else {
      io.stdout(
        [
          `${countOf(conflicts.length, 'conflict', 'conflicts', PRINTED)}: records changed in both files since they last met. Nothing was written.`,
          ...conflicts.map((c) => `  ${c.title} (${KIND_LABEL[c.kind]} ${c.id}): ${c.question}`),
          'Choose with --prefer newer (later edit wins), base or incoming.'
        ].join('\n')
      );
    }
    return CONFLICT_EXIT;
  }
  await writeExchangeOutput(
    out,
    mergedChangeSet('merge', [basename(basePath), basename(incomingPath)], merged.records)
  );
  const c = merged.counts;
  if (json)
    io.stdout(
      JSON.stringify({ written: true, out, counts: c, conflicts, prefer: preferText ?? null }, null, 2)
    );
  else {
    io.stdout(
      `${out}: ${c.new} new, ${c.updated} updated, ${c.unchanged} unchanged, ${c.deleted} deleted, ${c.conflict} conflicting` +
        (c.conflict > 0 ? ` (settled: ${preferText})` : '')
    );
  }
  return 0;
}
