import { readFile, stat } from 'node:fs/promises';
import {
  decodeExchangeFile,
  ExchangeFileError,
  sizeProblem,
  type ChangeSet
} from '../lib/exchange/exchange-file';
import { UsageError } from './cli-arguments';

/**
 * Reads and checks an exchange file from disk with the app's own checks; the size is looked at before a byte
 * is read. Every refusal becomes one UsageError line naming the file (exit 2). `bytes`: the file as already read
 * by the caller (rank reads it once to tell an exchange file from the demo portfolio file; a second read of a
 * 30 MB file cost about a tenth of its time).
 */
export async function readExchangeFile(path: string, bytes?: Uint8Array): Promise<ChangeSet> {
  if (!bytes) {
    let size: number;
    try {
      size = (await stat(path)).size;
    } catch {
      throw new UsageError(`Cannot read '${path}': no such file or not readable`);
    }
    const tooBig = sizeProblem(size);
    if (tooBig) throw new UsageError(`'${path}': ${tooBig}`);
  }
  try {
    // A view of the Buffer read, not a copy of it (30 MB for a company's file).
    const buffer = bytes ?? (await readFile(path));
    return await decodeExchangeFile(new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength));
  } catch (error) {
    if (error instanceof ExchangeFileError) throw new UsageError(`'${path}': ${error.message}`);
    throw error;
  }
}
