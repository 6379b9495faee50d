import { rename, rm, writeFile } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import type { RecordsByKind } from '../lib/domain/record-kinds';
import { changeSetOf, encodeExchangeFile, type ChangeSet } from '../lib/exchange/exchange-file';
import { unfinishedNameOf } from '../lib/exchange/folder-names';
import { UsageError } from './cli-arguments';

declare const __APP_VERSION__: string | undefined;

/** A merge's result as an exchange file written by the command line (`merge`, `gather`). */
export function mergedChangeSet(command: string, sources: string[], records: RecordsByKind): ChangeSet {
  return changeSetOf(
    {
      appVersion: typeof __APP_VERSION__ === 'string' ? __APP_VERSION__ : 'command-line',
      exportedBy: { deviceId: 'command-line', deviceName: `capstan ${command}` },
      exportedAt: new Date().toISOString(),
      scope: { kind: 'merged', sources }
    },
    records
  );
}

/**
 * Writes OUT (gzip when it ends in `.gz`) under a hidden temporary name beside it and renames it into place, so
 * that a sync service watching the folder never carries half a file, and a failed write leaves OUT as it was.
 */
export async function writeExchangeOutput(out: string, changeSet: ChangeSet): Promise<void> {
  const finalPath = resolve(out);
  const partPath = join(dirname(finalPath), unfinishedNameOf(basename(finalPath)));
  try {
    await writeFile(partPath, await encodeExchangeFile(changeSet, { gzip: out.endsWith('.gz') }));
    await rename(partPath, finalPath);
  } catch {
    await rm(partPath, { force: true });
    throw new UsageError(`Cannot write '${out}'`);
  }
}
