import { compileFn, withParser } from 'zod/v4/core';
import type { ExchangeHost } from '../lib/exchange/exchange-host';
import { nodeSha256Hex } from './node-sha256';

/**
 * How the command line hashes and checks exchange files: Node's own SHA-256, and the exchange schema compiled by
 * zod (one generated parser for the whole schema, which hands every rejection to the schema as written, so
 * verdicts and messages are the schema's own; a schema it cannot compile is used as written). The app cannot do
 * either: the browser has no synchronous hash, and its Content-Security-Policy forbids compiling.
 *
 * Built as `z.compile` builds it (zod's compileFn, installed by withParser) but without the second, check-only
 * function `z.compile` also generates for `validate`, which nothing here calls: 12 ms of every `check` and `rank`
 * of a company's file (CPU profile of `check` of the 2 000-process file).
 *
 * Measured on a 2 000-process exchange file (30 MB, 72 000 studies; tests/bench/company-portfolio-file.ts), Node 20:
 * Web Crypto's digest 91–134 ms against 18 ms for node:crypto; the schema check 435–555 ms as written against
 * 226–330 ms compiled, plus 58 ms to compile once per run.
 */
export const FAST_EXCHANGE_HOST: ExchangeHost = {
  sha256Hex: nodeSha256Hex,
  prepareSchema: (schema) => {
    try {
      return withParser(schema, compileFn(schema));
    } catch {
      return schema;
    }
  }
};
