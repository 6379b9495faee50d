import { keysWritten } from './exchange-guards';
import { sha256Hex } from './exchange-host';

/**
 * What an exchange file's text and bytes tell before they are parsed: how many keys the text writes (set against
 * the keys the parsed value holds, it shows a key written twice: exchange-guards.ts) and the SHA-256 of the
 * bytes as written. Both scan all 30 MB of a company's file without needing its parse, so the command line takes
 * them on a second thread while the first parses (exchange-host.ts, src/cli/written-facts-thread.ts); the app takes
 * them itself, asking for the digest first so that Web Crypto hashes off the page's thread meanwhile.
 */
export interface WrittenFileFacts {
  keysWritten: number;
  /** Undefined when the file is not exactly as written (re-indented, or no hash at its end). */
  written: WrittenHash | undefined;
}

/** The hash a file ends with, and the SHA-256 of the bytes that hash claims to cover. */
export interface WrittenHash {
  claimed: string;
  digest: string;
}

const ASCII_SPACE = [0x20, 0x09, 0x0a, 0x0d];
const TAIL_START = new TextEncoder().encode(',"sha256":"');
const HEX_DIGITS = 64;
/** `,"sha256":"` + the 64 hexadecimal digits of a hash + `"}`: the hash's key as a file ends with it. */
export const TAIL_LENGTH = TAIL_START.length + HEX_DIGITS + 2;

/**
 * The hash a file written by Capstan ends with, and the SHA-256 of the bytes the writer hashed: everything
 * before the final `,"sha256":"…"}`, closed with `}` (exchange-file.ts). Hashing the file's own bytes spares
 * encoding the text again (a fifth of `check`'s time on a 30 MB file) and re-serialising it. The closing brace is
 * written for a moment over the tail's first byte, so that the digest reads one view of the file (it copies its
 * input as it is called) and no 30 MB copy is made here; the byte is put back before anything else runs, so the
 * bytes must not be read by another thread meanwhile. Undefined when the file does not end so, or ends in white
 * space other than ASCII: its canonical form then gives the answer.
 */
export async function writtenHash(bytes: Uint8Array): Promise<WrittenHash | undefined> {
  const start = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  let end = bytes.length;
  while (end > start && ASCII_SPACE.includes(bytes[end - 1]!)) end -= 1;
  const bodyEnd = end - TAIL_LENGTH;
  if (bodyEnd <= start) return undefined;
  for (let i = 0; i < TAIL_START.length; i += 1) if (bytes[bodyEnd + i] !== TAIL_START[i]) return undefined;
  if (bytes[end - 2] !== 0x22 || bytes[end - 1] !== 0x7d) return undefined;
  // Whether the claim is a well-formed hash, and the file's own, the reader decides (exchange-file.ts).
  const hexAt = bodyEnd + TAIL_START.length;
  const claimed = String.fromCharCode(...bytes.subarray(hexAt, hexAt + HEX_DIGITS));
  let digest: Promise<string>;
  bytes[bodyEnd] = 0x7d; // }
  try {
    digest = sha256Hex(bytes.subarray(start, bodyEnd + 1));
  } finally {
    bytes[bodyEnd] = TAIL_START[0]!;
  }
  return { claimed, digest: await digest };
}

/**
 * Both facts of a file: `text` decoded strictly from `bytes` (so the keys counted are those of these bytes). The
 * digest is asked for first, so that where it runs off the thread (Web Crypto) the keys are counted meanwhile.
 */
export async function writtenFileFacts(text: string, bytes: Uint8Array): Promise<WrittenFileFacts> {
  const written = writtenHash(bytes);
  const keys = keysWritten(text);
  return { keysWritten: keys, written: await written };
}
