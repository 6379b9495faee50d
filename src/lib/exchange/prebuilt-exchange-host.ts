import { prebuiltParsers } from 'virtual:capstan-prebuilt-parsers';
import { WEB_HOST, type ExchangeHost } from './exchange-host';
import { withPrebuiltParser } from './generated-parser';

/**
 * How the app's exchange worker hashes and checks files: Web Crypto's digest, and the exchange schema run by the
 * parser zod generates for it, written into the bundle by the build (generated-parser.ts). Only the worker installs
 * it, so that the page's own scripts do not carry the parser's code.
 */
export const PREBUILT_EXCHANGE_HOST: ExchangeHost = {
  ...WEB_HOST,
  prepareSchema: (schema) => withPrebuiltParser(schema, prebuiltParsers)
};
