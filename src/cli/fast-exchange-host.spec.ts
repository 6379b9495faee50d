import { readdirSync, readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { changeSetOf, encodeExchangeFile } from '../lib/exchange/exchange-file';
import { sha256Hex, useExchangeHost, WEB_HOST, type ExchangeHost } from '../lib/exchange/exchange-host';
import { exchangeFileSchema } from '../lib/exchange/exchange-schema';
import { demoRecordSet, testFileHeader } from '../../tests/support/demo-change-set';
import { verdictWithHost } from '../../tests/support/host-verdict';
import { writtenFileFacts } from '../lib/exchange/written-file-facts';
import { FAST_EXCHANGE_HOST } from './fast-exchange-host';

/**
 * The command line's hash and compiled schema must give the app's verdicts exactly: every file of the bad-file
 * corpus refused with the same message, a valid file read into the same records.
 */
const corpus = new URL('../../tests/fixtures/bad-exchange-files/', import.meta.url);
// One moment for both hosts: the reader refuses clocks ahead of it.
const now = Date.now();
const webHost = WEB_HOST;
afterAll(() => void useExchangeHost(webHost));
const outcome = (host: ExchangeHost, bytes: Uint8Array) => verdictWithHost(host, bytes, now);

/**
 * The command line's host with its second thread as the main thread sees it (written-facts-thread.ts): the facts
 * taken from a copy of the bytes and handed back through a structured clone, after the main thread has gone on.
 */
const THREADED_HOST: ExchangeHost = {
  ...FAST_EXCHANGE_HOST,
  writtenFacts: async (bytes) => {
    const copy = bytes.slice();
    await new Promise((resolve) => setTimeout(resolve, 1));
    return structuredClone(await writtenFileFacts(new TextDecoder().decode(copy), copy));
  }
};
/** The same host when its thread could not start or failed: the main thread takes the facts itself. */
const FAILED_THREAD_HOST: ExchangeHost = {
  ...FAST_EXCHANGE_HOST,
  writtenFacts: () => Promise.reject(new Error('the thread failed'))
};

describe('the command line reads exchange files as the app does', () => {
  it('hashes to the published SHA-256 of "abc" (FIPS 180-2, appendix B.1) on both hosts', async () => {
    const abc = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';
    expect(await sha256Hex('abc')).toBe(abc);
    useExchangeHost(FAST_EXCHANGE_HOST);
    try {
      expect(await sha256Hex('abc')).toBe(abc);
    } finally {
      useExchangeHost(webHost);
    }
  });

  it('compiles the exchange schema (a schema zod cannot compile would be used as written, at twice the time)', () => {
    expect(FAST_EXCHANGE_HOST.prepareSchema(exchangeFileSchema)).not.toBe(exchangeFileSchema);
  });

  const files = readdirSync(corpus).filter((f) => f.includes('.capstan.json'));
  // Each file is read by four hosts: the corpus's largest (huge-unknown-field, unpacked from gzip) took 4 s alone on
  // a slow machine and over vitest's default 5 s beside the rest of the suite.
  it.each(files)(
    '%s: the same verdict with the compiled schema and Node hash',
    async (file) => {
      const bytes = new Uint8Array(readFileSync(new URL(file, corpus)));
      const app = await outcome(webHost, bytes);
      expect(await outcome(FAST_EXCHANGE_HOST, bytes)).toEqual(app);
      expect(await outcome(THREADED_HOST, bytes)).toEqual(app);
      expect(await outcome(FAILED_THREAD_HOST, bytes)).toEqual(app);
    },
    30_000
  );

  it('reads a valid file, written by either host, into the same records', async () => {
    const set = changeSetOf(testFileHeader('host test'), demoRecordSet(now));
    const written = await encodeExchangeFile(set);
    useExchangeHost(FAST_EXCHANGE_HOST);
    const writtenFast = await encodeExchangeFile(set).finally(() => useExchangeHost(webHost));
    expect(writtenFast).toEqual(written);
    const app = (await outcome(webHost, written)) as { records?: unknown };
    expect(app).toHaveProperty('records');
    expect(await outcome(FAST_EXCHANGE_HOST, written)).toEqual(app);
    expect(await outcome(THREADED_HOST, written)).toEqual(app);
    expect(await outcome(FAILED_THREAD_HOST, written)).toEqual(app);
  });
});
