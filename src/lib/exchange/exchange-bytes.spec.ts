import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../domain/canonical-json';
import { emptyRecords } from '../domain/record-kinds';
import { stampNew, type WriteContext } from '../domain/record-meta';
import { changeSetOf, decodeExchangeFile, encodeExchangeFile } from './exchange-file';
import { EXCHANGE_FORMAT, EXCHANGE_FORMAT_VERSION } from './exchange-schema';

const ctx: WriteContext = {
  deviceId: 'device-a',
  now: () => new Date('2026-06-01T00:00:00Z'),
  newId: (() => {
    let n = 0;
    return () => `00000000-0000-4000-8000-${String((n += 1)).padStart(12, '0')}`;
  })()
};

/** Site names of ASCII alone, and of any characters (accents, CJK, emoji, lone surrogates). */
const names = fc.array(
  fc.oneof(
    fc.string({ unit: 'grapheme-ascii', maxLength: 40 }),
    fc.string({ unit: 'grapheme', maxLength: 40 }),
    fc.string({ unit: 'binary', maxLength: 40 })
  ),
  { minLength: 1, maxLength: 6 }
);

describe('the bytes of an exchange file', () => {
  it('are the UTF-8 of its canonical text with the SHA-256 of that text’s bytes as its last key', async () => {
    await fc.assert(
      fc.asyncProperty(names, async (siteNames) => {
        const records = emptyRecords();
        records.sites = siteNames.map((name) =>
          stampNew({ name: `Site ${name}`, region: '', timeZone: 'UTC' }, ctx)
        );
        const changeSet = changeSetOf(
          {
            appVersion: 'test',
            exportedBy: { deviceId: 'device-a', deviceName: 'A' },
            exportedAt: '2026-06-01T00:00:00.000Z',
            scope: { kind: 'everything' }
          },
          records
        );
        // The reference: encoded whole by TextEncoder, hashed by Node's crypto.
        const text = canonicalJson({
          format: EXCHANGE_FORMAT,
          formatVersion: EXCHANGE_FORMAT_VERSION,
          header: changeSet.header,
          records: changeSet.records
        });
        const body = new TextEncoder().encode(text);
        const hash = createHash('sha256').update(body).digest('hex');
        const expected = new TextEncoder().encode(`${text.slice(0, -1)},"sha256":"${hash}"}`);
        const bytes = await encodeExchangeFile(changeSet);
        expect(bytes.byteLength).toBe(expected.byteLength);
        expect(Buffer.from(bytes).equals(Buffer.from(expected))).toBe(true);
        // Read back with every check, the hash among them.
        expect((await decodeExchangeFile(bytes)).records.sites.map((s) => s.id)).toEqual(
          records.sites.map((s) => s.id)
        );
      }),
      { numRuns: 200 }
    );
  });
});
