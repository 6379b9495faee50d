import type { z } from 'zod';
import type { WrittenFileFacts } from './written-file-facts';

/**
 * The two heavy steps of reading and writing an exchange file that a host can do faster its own way: the SHA-256
 * of the bytes, and the schema check. By default they are what every host has: Web Crypto's digest and the schema
 * as written (which the app's zod runs without eval, as its Content-Security-Policy requires). The command line,
 * which runs in Node and may compile, plugs in Node's hash and zod's compiled parser (src/cli/fast-exchange-host.ts).
 * Either way the same schema decides and the same SHA-256 comes out; only the speed differs.
 */
export interface ExchangeHost {
  /** Lower-case hex SHA-256 of the bytes. */
  sha256Hex(bytes: Uint8Array): Promise<string>;
  /** The schema as this host runs it: the schema itself, or a compiled parser that gives the same verdicts. */
  prepareSchema<T extends z.ZodType>(schema: T): T;
  /**
   * Takes a file's written facts (written-file-facts.ts: keys its text writes, the digest of its bytes) on
   * another thread while the reading thread parses it, given the bytes as decoded (the reader's own copy is not
   * touched). Resolves to undefined when that thread could not answer: the reading thread then takes them itself.
   */
  writtenFacts?(bytes: Uint8Array): Promise<WrittenFileFacts | undefined>;
}

async function webCryptoSha256Hex(bytes: Uint8Array): Promise<string> {
  // Web Crypto refuses views of shared memory, which the command line reads files into: those are copied first.
  // (A page that is not cross-origin isolated has no SharedArrayBuffer at all.)
  const shared = typeof SharedArrayBuffer !== 'undefined' && bytes.buffer instanceof SharedArrayBuffer;
  const input = shared ? bytes.slice() : bytes;
  const digest = await crypto.subtle.digest('SHA-256', input as BufferSource);
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, '0')).join('');
}

/** What every host has: Web Crypto's digest, and the schema as written. */
export const WEB_HOST: ExchangeHost = { sha256Hex: webCryptoSha256Hex, prepareSchema: (schema) => schema };

let host: ExchangeHost = WEB_HOST;
let prepared = new WeakMap<z.ZodType, z.ZodType>();

/**
 * Replaces the steps for the rest of the process (the command line calls this once, at start); returns the
 * ones it replaced.
 */
export function useExchangeHost(replacement: ExchangeHost): ExchangeHost {
  const previous = host;
  host = replacement;
  prepared = new WeakMap();
  return previous;
}

export function sha256Hex(content: string | Uint8Array): Promise<string> {
  return host.sha256Hex(typeof content === 'string' ? new TextEncoder().encode(content) : content);
}

/** The written facts of a file's bytes from the host's other thread, or undefined when it has none. */
export function writtenFactsElsewhere(bytes: Uint8Array): Promise<WrittenFileFacts | undefined> | undefined {
  return host.writtenFacts?.(bytes);
}

/** The schema as the host runs it, prepared on first use (compiling costs tens of milliseconds, once). */
export function hostSchema<T extends z.ZodType>(schema: T): T {
  let known = prepared.get(schema) as T | undefined;
  if (!known) prepared.set(schema, (known = host.prepareSchema(schema)));
  return known;
}
