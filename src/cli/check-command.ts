import { RECORD_KINDS } from '../lib/domain/record-kinds';
import type { RecordMeta } from '../lib/domain/record-meta';
import { parseArguments, rejectUnknown, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { readExchangeFile } from './exchange-file-input';

/** `check FILE`: validates an exchange file exactly as an import would, and prints its header and counts. */
export async function checkCommand(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseArguments(argv, ['json']);
  rejectUnknown(args, ['json'], 'check');
  const path = args.positional[0];
  if (!path || args.positional.length > 1)
    throw new UsageError('check needs one exchange file: check FILE [--json]');
  const { header, records } = await readExchangeFile(path);
  const counts = Object.fromEntries(
    RECORD_KINDS.map((k) => {
      const list = records[k] as RecordMeta[];
      const deleted = list.filter((r) => r.deletedAt !== undefined).length;
      return [k, { records: list.length, deleted }];
    })
  );
  if (args.flags.has('json')) {
    io.stdout(JSON.stringify({ valid: true, header, counts }, null, 2));
    return 0;
  }
  const scope =
    header.scope.kind === 'site'
      ? `site ${header.scope.siteName} (${header.scope.siteId})`
      : header.scope.kind === 'changes'
        ? `changes for ${header.scope.recipient.name || header.scope.recipient.deviceId}${header.scope.since ? ` since ${header.scope.since}` : ''}`
        : header.scope.kind === 'merged'
          ? `merge of ${header.scope.sources.join(' and ')}`
          : 'everything';
  const lines = [
    `${path}: valid Capstan exchange file (format version 1, content hash verified)`,
    `  exported ${header.exportedAt} by ${header.exportedBy.deviceName || '(unnamed device)'} [${header.exportedBy.deviceId}], app ${header.appVersion}`,
    `  scope: ${scope}`,
    ...RECORD_KINDS.map(
      (k) => `  ${k.padEnd(16)} ${String(counts[k]!.records).padStart(8)}  (${counts[k]!.deleted} deleted)`
    )
  ];
  io.stdout(lines.join('\n'));
  return 0;
}
