import { open } from 'node:fs/promises';
import {
  decodeExchangeFile,
  ExchangeFileError,
  sizeProblem,
  type ChangeSet
} from '../lib/exchange/exchange-file';
import { UsageError } from './cli-arguments';

/**
 * A file's bytes, read in one pass into memory another thread can read without a copy (the written facts' thread,
 * written-facts-thread.ts): a 30 MB file took 15 ms so against 22 ms for `readFile` and 15 ms more for the copy the
 * thread was handed. A Buffer over that memory, for the callers that read it as text. Every failure is a
 * UsageError naming the file: a folder, a file that is missing or cannot be read, or one whose size
 * `sizeProblem` refuses (looked at before a byte is read).
 */
export async function readFileShared(
  path: string,
  sizeProblem?: (bytes: number) => string | undefined
): Promise<Buffer> {
  let file;
  try {
    file = await open(path, 'r');
  } catch {
    throw new UsageError(`Cannot read '${path}': no such file or not readable`);
  }
  try {
    const info = await file.stat();
    if (info.isDirectory()) throw new UsageError(`'${path}' is a folder, not a file`);
    const tooBig = sizeProblem?.(info.size);
    if (tooBig) throw new UsageError(`'${path}': ${tooBig}`);
    const size = info.size;
    const bytes = new Uint8Array(new SharedArrayBuffer(size));
    let at = 0;
    while (at < size) {
      const { bytesRead } = await file.read(bytes, at, size - at, at);
      if (bytesRead === 0) break;
      at += bytesRead;
    }
    return Buffer.from(bytes.buffer, 0, at);
  } catch (error) {
    if (error instanceof UsageError) throw error;
    throw new UsageError(`Cannot read '${path}': ${error instanceof Error ? error.message : String(error)}`);
  } finally {
    await file.close();
  }
}

/**
 * Reads and checks an exchange file from disk with the app's own checks; the size is looked at before a byte
 * is read. Every refusal becomes one UsageError line naming the file (exit 2). `bytes`: the file as already read
 * by the caller (rank reads it once to tell an exchange file from the demo portfolio file; a second read of a
 * 30 MB file cost about a tenth of its time).
 */
export async function readExchangeFile(path: string, bytes?: Uint8Array): Promise<ChangeSet> {
  // A view of the Buffer read, not a copy of it (30 MB for a company's file).
  const buffer = bytes ?? (await readFileShared(path, sizeProblem));
  try {
    return await decodeExchangeFile(new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength));
  } catch (error) {
    if (error instanceof ExchangeFileError) throw new UsageError(`'${path}': ${error.message}`);
    throw error;
  }
}
