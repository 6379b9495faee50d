import { readdirSync, readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { changeSetOf, decodeExchangeFile, encodeExchangeFile } from '../lib/exchange/exchange-file';
import { sha256Hex, useExchangeHost, type ExchangeHost } from '../lib/exchange/exchange-host';
import { demoRecordSet, testFileHeader } from '../../tests/support/demo-change-set';
import { FAST_EXCHANGE_HOST } from './fast-exchange-host';

/**
 * The command line's hash and compiled schema must give the app's verdicts exactly: every file of the bad-file
 * corpus refused with the same message, a valid file read into the same records.
 */
const corpus = new URL('../../tests/fixtures/bad-exchange-files/', import.meta.url);
// One moment for both hosts: the reader refuses clocks ahead of it.
const now = Date.now();
let webHost: ExchangeHost;
beforeAll(() => {
  webHost = useExchangeHost(FAST_EXCHANGE_HOST);
  useExchangeHost(webHost);
});
afterAll(() => void useExchangeHost(webHost));

async function outcome(host: ExchangeHost, bytes: Uint8Array): Promise<unknown> {
  useExchangeHost(host);
  try {
    // A copy each time: the reader writes a byte over the file's tail for a moment while hashing.
    return { records: (await decodeExchangeFile(bytes.slice(), undefined, now)).records };
  } catch (e) {
    return { refused: e instanceof Error ? e.message : String(e) };
  } finally {
    useExchangeHost(webHost);
  }
}

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

  const files = readdirSync(corpus).filter((f) => f.includes('.capstan.json'));
  it.each(files)('%s: the same verdict with the compiled schema and Node hash', async (file) => {
    const bytes = new Uint8Array(readFileSync(new URL(file, corpus)));
    const app = await outcome(webHost, bytes);
    expect(await outcome(FAST_EXCHANGE_HOST, bytes)).toEqual(app);
  });

  it('reads a valid file, written by either host, into the same records', async () => {
    const set = changeSetOf(testFileHeader('host test'), demoRecordSet(now));
    const written = await encodeExchangeFile(set);
    useExchangeHost(FAST_EXCHANGE_HOST);
    const writtenFast = await encodeExchangeFile(set).finally(() => useExchangeHost(webHost));
    expect(writtenFast).toEqual(written);
    const app = (await outcome(webHost, written)) as { records?: unknown };
    expect(app).toHaveProperty('records');
    expect(await outcome(FAST_EXCHANGE_HOST, written)).toEqual(app);
  });
});
