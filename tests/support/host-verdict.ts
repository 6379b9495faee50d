import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { useExchangeHost, WEB_HOST, type ExchangeHost } from '../../src/lib/exchange/exchange-host';

/**
 * What reading a file's bytes with `host` gives: its records, or the one line refusing it. The app's default
 * host is put back afterwards. Specs compare hosts by it: the same verdict, whichever host reads.
 */
export async function verdictWithHost(
  host: ExchangeHost,
  bytes: Uint8Array,
  nowMs: number
): Promise<unknown> {
  useExchangeHost(host);
  try {
    // A copy each time: the reader writes a byte over the file's tail for a moment while hashing.
    return { records: (await decodeExchangeFile(bytes.slice(), undefined, nowMs)).records };
  } catch (e) {
    return { refused: e instanceof Error ? e.message : String(e) };
  } finally {
    useExchangeHost(WEB_HOST);
  }
}
