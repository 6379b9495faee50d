/**
 * Exchange file of 100 000 studies (30 raw values each, as a year of a large portfolio): writing it (canonical
 * JSON + SHA-256, then gzip), reading it back with every check (hash, structure, schema, duplicate keys and ids, bounds), and
 * merging it into an equal record set, each beside a bare JSON.stringify / JSON.parse of the same records in the
 * same run. Peak heap is sampled before and after each step (a lower bound of the true peak). Prints only.
 */
import { stampNew, type WriteContext } from '../../src/lib/domain/record-meta';
import { mergeRecordSets } from '../../src/lib/domain/record-set-merge';
import { changeSetOf, decodeExchangeFile, encodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import type { BenchRow } from './engine-bench';
import { seededIds } from './seeded-ids';

const STUDIES = 100_000;

export async function runExchangeFileBench(): Promise<BenchRow[]> {
  const ctx: WriteContext = {
    deviceId: 'bench-device',
    now: () => new Date('2026-06-01T00:00:00Z'),
    newId: seededIds(20260601)
  };
  const site = stampNew({ name: 'Bench works', region: '', timeZone: 'UTC' }, ctx);
  const processes = Array.from({ length: 500 }, (_, i) =>
    stampNew(
      {
        siteId: site.id,
        name: `Process ${i}`,
        owner: '',
        contextId: 'general-manufacturing',
        monthlyVolume: 1000,
        costPerDefective: 2,
        currency: 'EUR'
      },
      ctx
    )
  );
  const characteristics = processes.flatMap((p, i) =>
    Array.from({ length: 4 }, (_, j) =>
      stampNew(
        {
          processId: p.id,
          name: `C${i}.${j}`,
          unit: 'mm',
          dataKind: 'measured' as const,
          lsl: 9,
          usl: 11,
          riskClass: 'standard' as const
        },
        ctx
      )
    )
  );
  const studies = Array.from({ length: STUDIES }, (_, i) =>
    stampNew(
      {
        characteristicId: characteristics[i % characteristics.length]!.id,
        period: `${2018 + Math.floor(i / characteristics.length / 12)}-${String((Math.floor(i / characteristics.length) % 12) + 1).padStart(2, '0')}`,
        data: {
          kind: 'raw' as const,
          values: Array.from({ length: 30 }, (_, k) => 10 + (((i * 31 + k * 17) % 200) - 100) / 1000)
        },
        enteredBy: 'bench'
      },
      ctx
    )
  );
  const records = {
    contextProfiles: [],
    sites: [site],
    processes,
    characteristics,
    studies,
    projects: [],
    reviews: []
  };
  const header = {
    appVersion: 'bench',
    exportedBy: { deviceId: 'bench-device', deviceName: 'bench' },
    exportedAt: '2026-06-01T00:00:00.000Z',
    scope: { kind: 'everything' as const }
  };
  const heap = () => process.memoryUsage().heapUsed;
  const rows: BenchRow[] = [];

  let t = performance.now();
  const bare = JSON.stringify(records);
  const bareWrite = performance.now() - t;
  t = performance.now();
  JSON.parse(bare);
  const bareRead = performance.now() - t;

  t = performance.now();
  const plain = await encodeExchangeFile(changeSetOf(header, records));
  const writeMs = performance.now() - t;
  t = performance.now();
  const packed = await encodeExchangeFile(changeSetOf(header, records), { gzip: true });
  const gzipMs = performance.now() - t;
  const h1 = heap();
  t = performance.now();
  const decoded = await decodeExchangeFile(plain);
  const readMs = performance.now() - t;
  const h2 = heap();
  t = performance.now();
  await decodeExchangeFile(packed);
  const readGzMs = performance.now() - t;
  t = performance.now();
  const merged = mergeRecordSets(records as never, decoded.records);
  const mergeMs = performance.now() - t;
  const mb = (b: number) => `${(b / 1048576).toFixed(0)} MB`;

  rows.push({
    name: `exchange file, ${STUDIES.toLocaleString('en')} studies × 30 values: write (canonical JSON + SHA-256), ${mb(plain.byteLength)}`,
    ms: writeMs,
    baselineName: 'JSON.stringify of the same records',
    baselineMs: bareWrite
  });
  rows.push({ name: `  … written gzip-compressed, ${mb(packed.byteLength)}`, ms: gzipMs });
  rows.push({
    name: '  … read back with every check (hash, structure, zod schema, duplicate keys and ids, bounds)',
    ms: readMs,
    baselineName: 'JSON.parse of the same text',
    baselineMs: bareRead,
    target: `heap +${mb(Math.max(0, h2 - h1))} held after reading (a lower bound of the peak)`
  });
  rows.push({ name: '  … read back from the gzip file', ms: readGzMs });
  rows.push({
    name: `  … merged into an equal record set (${merged.counts.unchanged.toLocaleString('en')} unchanged)`,
    ms: mergeMs
  });
  return rows;
}
