import 'fake-indexeddb/auto';
import { Dexie, type DBCore, type Middleware } from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import demo from '../../seed-data/demo-portfolio.json';
import { canonicalExport } from '../support/exchange-harness';
import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { prepareExport } from '../../src/lib/exchange/export-change-set';
import { explainStorageError, StorageProblem } from '../../src/lib/storage/storage-errors';
import { openStorage, type CapstanStorage, databaseOf } from '../../src/lib/storage/storage';
import { CURRENT_SCHEMA_VERSION } from '../../src/lib/storage/schema-versions';

/**
 * Faults a browser database really meets, under fake-indexeddb: a full disk during an import or a save, an
 * upgrade blocked by a tab that holds the old version, and a database written by a newer app.
 */
const opened: CapstanStorage[] = [];
afterEach(async () => {
  for (const s of opened.splice(0)) {
    databaseOf(s).close();
    await databaseOf(s).delete();
  }
});

/** Makes every write to `table` fail as a full disk does, once the database is reopened with it. */
function fullDisk(table: string): Middleware<DBCore> {
  return {
    stack: 'dbcore',
    name: 'fullDisk',
    create(down) {
      return {
        ...down,
        table(name) {
          const t = down.table(name);
          if (name !== table) return t;
          return {
            ...t,
            mutate: () =>
              Promise.reject(new DOMException('The quota has been exceeded.', 'QuotaExceededError'))
          };
        }
      };
    }
  };
}

describe('storage faults', () => {
  it('a full disk during an import rolls the whole import back and says so', async () => {
    const source = await openStorage(`fault-src-${Math.random()}`);
    opened.push(source);
    await source.loadDemo(demo);
    const file = (
      await prepareExport(
        source,
        { kind: 'everything' },
        { appVersion: 't', deviceName: 's', exportedAt: '2026-12-01T00:00:00.000Z' }
      )
    ).bytes;

    const target = await openStorage(`fault-dst-${Math.random()}`);
    opened.push(target);
    await target.sites.create({ name: 'Plant kept', region: '', timeZone: 'UTC' });
    const before = await canonicalExport(target);
    // Sites and processes would be written first; the disk fills up at the studies.
    databaseOf(target).use(fullDisk('studyShelves'));
    databaseOf(target).close();
    await databaseOf(target).open();
    const changeSet = await decodeExchangeFile(file);
    const plan = await target.exchange.preview(changeSet.records);
    const error = await target.exchange
      .apply(plan, {}, { deviceId: 'x', name: 'x', at: '2026-12-01T00:00:00Z' })
      .catch((e) => e);
    expect(error).toBeInstanceOf(StorageProblem);
    expect(error.kind).toBe('full');
    expect(error.message).toMatch(
      /^The import was not saved: this device's storage for Capstan is full, and nothing of it was written/
    );
    expect(await canonicalExport(target)).toBe(before);
    expect(await databaseOf(target).processes.count()).toBe(0);
  });

  it('a full disk during a save leaves the stored month as it was, and the page can say so', async () => {
    const s = await openStorage(`fault-save-${Math.random()}`);
    opened.push(s);
    await s.loadDemo(demo);
    const characteristic = demo.records.characteristics[0]!;
    const before = await canonicalExport(s);
    databaseOf(s).use(fullDisk('studyShelves'));
    databaseOf(s).close();
    await databaseOf(s).open();
    const error = await s.studies
      .logOne(
        {
          characteristicId: characteristic.id,
          period: '2020-01',
          data: { kind: 'summary', n: 30, mean: 1, sd: 0.1 },
          enteredBy: 'test'
        },
        'new'
      )
      .catch((e: unknown) => e);
    const explained = explainStorageError(error, 'The study') as StorageProblem;
    expect(explained).toBeInstanceOf(StorageProblem);
    expect(explained.message).toMatch(/^The study was not saved: this device's storage for Capstan is full/);
    expect(await canonicalExport(s)).toBe(before);
  });

  it('a database written by a newer app is refused, not changed', async () => {
    const name = `fault-newer-${Math.random()}`;
    const newer = new Dexie(name);
    newer.version(CURRENT_SCHEMA_VERSION + 1).stores({ sites: 'id', future: 'id' });
    await newer.open();
    await newer.table('future').add({ id: 'kept' });
    newer.close();
    const error = await openStorage(name).catch((e) => e);
    expect(error).toBeInstanceOf(StorageProblem);
    expect(error.kind).toBe('newer-version');
    expect(error.message).toContain('written by a newer version of Capstan');
    const again = new Dexie(name);
    again.version(CURRENT_SCHEMA_VERSION + 1).stores({ sites: 'id', future: 'id' });
    await again.open();
    expect(await again.table('future').get('kept')).toEqual({ id: 'kept' });
    again.close();
    await Dexie.delete(name);
  });

  it('an upgrade blocked by an old tab is explained, and goes on when that tab closes', async () => {
    const name = `fault-blocked-${Math.random()}`;
    // An "old tab": a raw connection at an older version that ignores the request to close.
    const old = await new Promise<IDBDatabase>((resolve, reject) => {
      const req = indexedDB.open(name, 10);
      req.onupgradeneeded = () => req.result.createObjectStore('sites', { keyPath: 'id' });
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error);
    });
    old.onversionchange = () => undefined;
    const messages: string[] = [];
    const opening = openStorage(name, undefined, { onBlocked: (m) => messages.push(m) });
    await new Promise((r) => setTimeout(r, 200));
    expect(messages[0]).toMatch(
      /^Another Capstan tab or window still holds the older version of the database/
    );
    old.close();
    const storage = await opening;
    opened.push(storage);
    expect(databaseOf(storage).verno).toBe(CURRENT_SCHEMA_VERSION);
  });
});
