/**
 * Runs inside headless Chromium (bundled by browser-bench.ts): writes and reads 100 000 studies through the
 * app's database class — its schema with five study indexes and the write-sequence middleware — and through a
 * bare Dexie table with three indexes, in the same chunks, in the same run.
 */
import { Dexie } from 'dexie';
import { stampNew, type WriteContext } from '../../../src/lib/domain/record-meta';
import type { Study } from '../../../src/lib/domain/study';
import { CapstanDatabase } from '../../../src/lib/storage/database';

const COUNT = 100_000;
const CHUNK = 5_000;

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
        characteristicId: `c${i % 2000}`,
        period: `20${18 + Math.floor(i / 24000)}-${String((Math.floor(i / 2000) % 12) + 1).padStart(2, '0')}`,
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
  const bare = new Dexie('bench-bare');
  bare.version(1).stores({ studies: 'id, characteristicId, period' });
  await bare.open();
  const bareTimes = await timed(
    (c) => bare.table('studies').bulkPut(c),
    () => bare.table('studies').toArray(),
    rows
  );
  bare.close();
  const app = new CapstanDatabase('bench-app');
  await app.open();
  const appTimes = await timed(
    (c) => app.studies.bulkPut(c),
    () => app.studies.toArray(),
    rows
  );
  app.close();
  await Dexie.delete('bench-bare');
  await Dexie.delete('bench-app');
  return { count: COUNT, chunk: CHUNK, bare: bareTimes, app: appTimes };
}

(window as unknown as { runIndexedDbBench: typeof runIndexedDbBench }).runIndexedDbBench = runIndexedDbBench;
