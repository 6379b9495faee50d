/**
 * Runs inside headless Chromium (bundled by browser-bench.ts): writes and reads 100 000 studies through the
 * app's database class — studies on shelves, one record per characteristic (storage/study-shelves.ts), with the
 * write-sequence middleware — and through bare Dexie tables, in the same chunks, in the same run: one record per
 * study with v9's study schema (what the app wrote before shelves), and the same shelves written by hand.
 */
import { Dexie } from 'dexie';
import { stampNew, type WriteContext } from '../../../src/lib/domain/record-meta';
import type { Study } from '../../../src/lib/domain/study';
import { HybridClock } from '../../../src/lib/domain/hybrid-clock';
import { changeSetOf, decodeExchangeFile, encodeExchangeFile } from '../../../src/lib/exchange/exchange-file';
import { applyChangeSet, collectChanges, previewChangeSet } from '../../../src/lib/storage/change-set-store';
import { CapstanDatabase } from '../../../src/lib/storage/database';
import { SCHEMA_V10, SCHEMA_V9 } from '../../../src/lib/storage/schema-versions';
import { allStudies, putStudies } from '../../../src/lib/storage/study-shelves';

const COUNT = 100_000;
const CHUNK = 5_000;
/** Months of each characteristic: the studies come a characteristic at a time, as a file's import writes them. */
const MONTHS = 50;

function studies(): Study[] {
  let n = 0;
  const ctx: WriteContext = {
    deviceId: 'bench',
    now: () => new Date('2026-06-01T00:00:00Z'),
    newId: () => `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}`
  };
  return Array.from({ length: COUNT }, (_, i) =>
    stampNew(
      {
        characteristicId: `00000000-0000-4000-9000-${String(Math.floor(i / MONTHS)).padStart(12, '0')}`,
        period: `20${20 + Math.floor((i % MONTHS) / 12)}-${String(((i % MONTHS) % 12) + 1).padStart(2, '0')}`,
        data: { kind: 'summary' as const, n: 50, mean: 10 + (i % 100) / 1000, sd: 0.5 },
        enteredBy: 'bench'
      },
      ctx
    )
  ) as Study[];
}

async function timed(
  write: (chunk: Study[]) => Promise<unknown>,
  read: () => Promise<unknown[]>,
  rows: Study[]
) {
  let t = performance.now();
  for (let i = 0; i < rows.length; i += CHUNK) await write(rows.slice(i, i + CHUNK));
  const writeMs = performance.now() - t;
  t = performance.now();
  const back = await read();
  const readMs = performance.now() - t;
  if (back.length !== rows.length) throw new Error(`read ${back.length} of ${rows.length}`);
  return { writeMs, readMs };
}

export async function runIndexedDbBench() {
  const rows = studies();
  await Dexie.delete('bench-bare');
  await Dexie.delete('bench-app');
  // One record per study with v9's study schema (its indexes and a write sequence number set by hand).
  const bare = new Dexie('bench-bare');
  bare.version(1).stores({ studies: SCHEMA_V9.studies });
  await bare.open();
  let seq = 0;
  const bareTimes = await timed(
    (c) => bare.table('studies').bulkPut(c.map((r) => ({ ...r, localSeq: ++seq }))),
    () => bare.table('studies').toArray(),
    rows
  );
  bare.close();
  // The same studies on shelves written by hand into a bare Dexie table of the app's schema: what remains between
  // this and the app is the app's code (reading the shelves back, the middleware), not the schema.
  await Dexie.delete('bench-same-schema');
  const same = new Dexie('bench-same-schema');
  same.version(1).stores(SCHEMA_V10);
  await same.open();
  const sameTimes = await timed(
    (c) => {
      const shelves = new Map<string, Study[]>();
      for (const r of c) shelves.set(r.characteristicId, [...(shelves.get(r.characteristicId) ?? []), r]);
      return same.table('studyShelves').bulkPut(
        [...shelves].map(([characteristicId, studies]) => ({
          characteristicId,
          studies: studies.map((r) => ({ ...r, localSeq: ++seq })),
          localSeq: seq,
          size: studies.length
        }))
      );
    },
    async () => (await same.table('studyShelves').toArray()).flatMap((s: { studies: Study[] }) => s.studies),
    rows
  );
  same.close();
  await Dexie.delete('bench-same-schema');
  const app = new CapstanDatabase('bench-app');
  await app.open();
  const appTimes = await timed(
    (c) => putStudies(app, c),
    () => allStudies(app),
    rows
  );

  // The whole database as an exchange file, then that file merged into an empty database, as the page does.
  const heap = () =>
    (performance as unknown as { memory?: { usedJSHeapSize: number } }).memory?.usedJSHeapSize ?? 0;
  let peak = heap();
  const sample = () => (peak = Math.max(peak, heap()));
  let t = performance.now();
  const collected = await collectChanges(app, { kind: 'everything' });
  sample();
  const header = {
    appVersion: 'bench',
    exportedBy: { deviceId: 'bench', deviceName: 'bench' },
    exportedAt: '2026-06-01T00:00:00.000Z',
    scope: { kind: 'everything' as const }
  };
  const bytes = await encodeExchangeFile(changeSetOf(header, collected.records), { gzip: true });
  sample();
  const exportMs = performance.now() - t;
  app.close();
  const target = new CapstanDatabase('bench-import');
  await target.open();
  t = performance.now();
  const changeSet = await decodeExchangeFile(bytes);
  sample();
  const plan = await previewChangeSet(target, changeSet.records);
  sample();
  const writer = { deviceId: 'bench', now: () => new Date(), newId: () => crypto.randomUUID() };
  await applyChangeSet(target, plan, {}, writer, new HybridClock('bench'), {
    deviceId: 'bench',
    name: 'bench',
    at: header.exportedAt
  });
  sample();
  const importMs = performance.now() - t;
  const imported = (await allStudies(target)).length;
  target.close();
  await Dexie.delete('bench-bare');
  await Dexie.delete('bench-app');
  await Dexie.delete('bench-import');
  return {
    count: COUNT,
    chunk: CHUNK,
    bare: bareTimes,
    sameSchema: sameTimes,
    app: appTimes,
    exchange: { exportMs, importMs, fileBytes: bytes.byteLength, imported, peakHeap: peak }
  };
}

(window as unknown as { runIndexedDbBench: typeof runIndexedDbBench }).runIndexedDbBench = runIndexedDbBench;
