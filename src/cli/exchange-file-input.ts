import { decodeExchangeFile, ExchangeFileError, type ChangeSet } from '../lib/exchange/exchange-file';
import { sizeProblem } from '../lib/exchange/exchange-guards';
import { UsageError } from './cli-arguments';
import { readFileShared } from './shared-file-read';

/**
 * Reads and checks an exchange file from disk with the app's own checks; the size is looked at before a byte
 * is read. Every refusal becomes one UsageError line naming the file (exit 2). `bytes`: the file as already read
 * by the caller (rank reads it once to tell an exchange file from the demo portfolio file; a second read of a
 * 30 MB file cost about a tenth of its time).
 */
export async function readExchangeFile(path: string, bytes?: Uint8Array): Promise<ChangeSet> {
  // A view of the Buffer read, not a copy of it (30 MB for a company's file).
  const buffer = bytes ?? (await readExchangeBytes(path));
  try {
    return await decodeExchangeFile(new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength));
  } catch (error) {
    if (error instanceof ExchangeFileError) throw new UsageError(`'${path}': ${error.message}`);
    throw error;
  }
}

/** An exchange file's bytes, its size looked at before a byte is read; refusals as UsageErrors naming the file. */
export function readExchangeBytes(path: string): Promise<Buffer> {
  return readFileShared(path, sizeProblem);
}
