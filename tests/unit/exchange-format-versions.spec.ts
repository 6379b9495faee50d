import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { EXCHANGE_FORMAT_VERSIONS_READ } from '../../src/lib/exchange/exchange-format-versions';

/**
 * Every format version ever shipped is read: one good file of each (tests/fixtures/exchange-format), with its
 * records as written. A new format version adds its file here, and the reader restores older ones.
 */
const fixture = (version: number) =>
  new Uint8Array(
    readFileSync(new URL(`../fixtures/exchange-format/format-${version}.capstan.json`, import.meta.url))
  );

describe('exchange files of every shipped format version', () => {
  it('has a fixture for every version the reader accepts', () => {
    expect(EXCHANGE_FORMAT_VERSIONS_READ).toEqual([1]);
  });

  it('reads format version 1 with every record as written', async () => {
    const set = await decodeExchangeFile(fixture(1));
    expect(set.header.exportedBy).toEqual({ deviceId: 'wendle-lead', deviceName: 'Wendle lead' });
    expect(set.records.sites.map((s) => s.name)).toEqual(['Wendle Pressings']);
    expect(set.records.characteristics.map((c) => c.name).sort()).toEqual(['Edge cracks', 'Hole position']);
    const hole = set.records.studies.find((s) => s.data.kind === 'summary')!;
    expect(hole).toMatchObject({
      period: '2026-09',
      data: { kind: 'summary', n: 50, mean: 12.004, sd: 0.021 },
      note: 'corrected gauge offset',
      rev: 2,
      vv: { 'wendle-lead': 2 }
    });
  });
});
