import { open } from 'node:fs/promises';
import { sizeProblem as exchangeSizeProblem } from '../lib/exchange/exchange-guards';
import { UsageError } from './cli-arguments';

/** Reads begun by `readAhead`, by path, until a command asks for the file. */
const readsAhead = new Map<string, Promise<Buffer | undefined>>();

/**
 * Starts reading a file a command is about to read, while the command line still loads that command's modules
 * (zod and the exchange schema, some 60 ms in which the main thread has no file to work on; reading a 30 MB file
 * takes some 20 ms on another thread). Nothing is decided here: a read that fails, or of a file the exchange
 * reader refuses by its size (looked at first, so that no oversized file is read), leaves nothing, and the command
 * reads the file itself and gives its own message. A read the command never asks for (the first argument was not
 * its file) is left unused.
 */
export function readAhead(path: string): void {
  readsAhead.set(
    path,
    readOnce(path, exchangeSizeProblem).catch(() => undefined)
  );
}

/**
 * A file's bytes, read in one pass into memory another thread can read without a copy (the written facts' thread,
 * written-facts-thread.ts): a 30 MB file took 15 ms so against 22 ms for `readFile` and 15 ms more for the copy the
 * thread was handed. A Buffer over that memory, for the callers that read it as text. Every failure is a
 * UsageError naming the file: a folder, a file that is missing or cannot be read, or one whose size
 * `sizeProblem` refuses (looked at before a byte is read). A read of the same path begun by `readAhead` is taken
 * when it succeeded and `sizeProblem` accepts its length.
 */
export async function readFileShared(
  path: string,
  sizeProblem?: (bytes: number) => string | undefined
): Promise<Buffer> {
  const early = readsAhead.get(path);
  if (early) {
    readsAhead.delete(path);
    const bytes = await early;
    if (bytes && !sizeProblem?.(bytes.byteLength)) return bytes;
  }
  return readOnce(path, sizeProblem);
}

async function readOnce(
  path: string,
  sizeProblem: ((bytes: number) => string | undefined) | undefined
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
