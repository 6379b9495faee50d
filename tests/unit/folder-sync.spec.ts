import 'fake-indexeddb/auto';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { changeSetOf, decodeExchangeFile, exchangeText } from '../../src/lib/exchange/exchange-file';
import { syncWithFolder } from '../../src/lib/exchange/folder-sync';
import { writeExport } from '../../src/lib/exchange/export-change-set';
import type { CapstanStorage } from '../../src/lib/storage/storage';
import { closeDevice, openDevice } from '../support/exchange-harness';
import { nodeDirectoryHandle } from '../support/node-directory-handle';

/**
 * The folder transport (exchange/folder-sync.ts) on a real directory on disk, with devices on fake-indexeddb:
 * the folder is what a sync service would carry between them, so here both devices simply use the same one.
 */
const root = mkdtempSync(join(tmpdir(), 'capstan-folder-sync-'));
const devices: CapstanStorage[] = [];
afterEach(async () => {
  for (const d of devices.splice(0)) await closeDevice(d);
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

let folders = 0;
function newFolder(): string {
  folders += 1;
  const path = join(root, `shared-${folders}`);
  rmSync(path, { recursive: true, force: true });
  mkdirSync(path);
  return path;
}

async function device(name: string): Promise<CapstanStorage> {
  const s = await openDevice(name.toLowerCase().replace(/\W+/g, '-'));
  await s.setDeviceName(name);
  devices.push(s);
  return s;
}

const sync = (storage: CapstanStorage, path: string) =>
  syncWithFolder({ storage, folder: nodeDirectoryHandle(path), appVersion: 'test' });

async function siteNames(s: CapstanStorage) {
  return (await s.sites.list())
    .filter((x) => !x.deletedAt)
    .map((x) => x.name)
    .sort();
}

describe('sync through a shared folder', () => {
  it('each device writes one file of its own, reads the others and merges them; a second round changes nothing', async () => {
    const path = newFolder();
    const north = await device('North lead');
    const office = await device('Quality office');
    await north.sites.create({ name: 'North Ridge', timeZone: 'Europe/Oslo', region: 'North' });

    const first = await sync(north, path);
    expect(first.wrote).toBe(true);
    const afterNorth = readdirSync(path);
    expect(afterNorth).toHaveLength(1);
    expect(afterNorth[0]).toMatch(/^North-lead-[0-9a-z]{8}\.capstan\.json\.gz$/);

    const second = await sync(office, path);
    expect(second.merged.map((f) => f.deviceName)).toEqual(['North lead']);
    expect(second.merged[0]!.counts!.new).toBe(1);
    expect(await siteNames(office)).toEqual(['North Ridge']);
    expect(readdirSync(path).sort()).toHaveLength(2);
    // No temporary name is left behind.
    expect(readdirSync(path).filter((n) => n.startsWith('.'))).toEqual([]);

    // The office's file holds nothing new for the site: merged without a write, and the site's file stays.
    const third = await sync(north, path);
    expect(third.merged.map((f) => f.counts!.new + f.counts!.updated)).toEqual([0]);
    expect(third.wrote).toBe(false);
    const fourth = await sync(office, path);
    expect(fourth.merged).toEqual([]);
    expect(fourth.wrote).toBe(false);
  });

  it('a crossing edit waits for a person in both devices, and nothing of that file is merged', async () => {
    const path = newFolder();
    const north = await device('North lead');
    const office = await device('Quality office');
    const site = await north.sites.create({ name: 'North Ridge', timeZone: 'Europe/Oslo', region: 'North' });
    await sync(north, path);
    await sync(office, path);
    await north.sites.update(site.id, {
      name: 'North Ridge Machining',
      timeZone: 'Europe/Oslo',
      region: 'North'
    });
    await office.sites.update(site.id, {
      name: 'North Ridge plant',
      timeZone: 'Europe/Oslo',
      region: 'North'
    });
    await sync(north, path);
    const seen = await sync(office, path);
    expect(seen.waiting.map((f) => f.deviceName)).toEqual(['North lead']);
    expect(seen.waiting[0]!.counts!.conflict).toBe(1);
    expect(await siteNames(office)).toEqual(['North Ridge plant']);
    const back = await sync(north, path);
    expect(back.waiting.map((f) => f.deviceName)).toEqual(['Quality office']);
    expect(await siteNames(north)).toEqual(['North Ridge Machining']);
    // Looked at again without a change on either side, it is still waiting (and is not read again).
    const again = await sync(north, path);
    expect(again.waiting).toHaveLength(1);
  });

  it('skips unfinished names, names a damaged file and still merges the others; reads a conflict copy like any file', async () => {
    const path = newFolder();
    const north = await device('North lead');
    const office = await device('Quality office');
    await north.sites.create({ name: 'North Ridge', timeZone: 'Europe/Oslo', region: 'North' });
    await sync(north, path);
    const [northFile] = readdirSync(path) as [string];
    const bytes = readFileSync(join(path, northFile));
    writeFileSync(join(path, `.syncthing.${northFile}.tmp`), bytes.subarray(0, 100));
    writeFileSync(join(path, `~syncthing~${northFile}.tmp`), bytes.subarray(0, 100));
    writeFileSync(join(path, `${northFile}.part`), bytes.subarray(0, 100));
    writeFileSync(join(path, 'cut-off.capstan.json.gz'), bytes.subarray(0, bytes.length - 40));
    writeFileSync(join(path, 'notes.txt'), 'not ours');
    const copy = northFile.replace(/\.gz$/, '.sync-conflict-20261203-101010-ABCDEFG.gz');
    writeFileSync(join(path, copy), bytes);

    const seen = await sync(office, path);
    expect(seen.skipped.map((f) => f.name)).toEqual(['cut-off.capstan.json.gz']);
    expect(seen.skipped[0]!.problem).toMatch(/\S/);
    expect(seen.merged.map((f) => f.name).sort()).toEqual([northFile, copy].sort());
    expect(await siteNames(office)).toEqual(['North Ridge']);
  });

  it('a renamed device writes its file under the new name and removes the old one', async () => {
    const path = newFolder();
    const north = await device('North lead');
    await north.sites.create({ name: 'North Ridge', timeZone: 'Europe/Oslo', region: 'North' });
    await sync(north, path);
    await north.setDeviceName('North Ridge lead');
    const renamed = await sync(north, path);
    expect(renamed.wrote).toBe(true);
    expect(readdirSync(path)).toEqual([expect.stringMatching(/^North-Ridge-lead-\w{8}\.capstan\.json\.gz$/)]);
  });

  it("writes the export worker's Blob into the folder as it is, not a copy of its bytes", async () => {
    const path = newFolder();
    const north = await device('North lead');
    await north.sites.create({ name: 'North Ridge', timeZone: 'Europe/Oslo', region: 'North' });
    const disk = nodeDirectoryHandle(path);
    const written: unknown[] = [];
    // The folder as the page holds it, noting what each writer is given.
    const folder = {
      ...disk,
      values: () => disk.values(),
      async getFileHandle(name: string, options?: { create?: boolean }) {
        const handle = await disk.getFileHandle(name, options);
        return {
          ...handle,
          get name() {
            return handle.name;
          },
          getFile: () => handle.getFile(),
          move: handle.move && ((to: string) => handle.move!(to)),
          async createWritable() {
            const writer = await handle.createWritable();
            return {
              write: (data: Uint8Array | Blob) => (written.push(data), writer.write(data)),
              close: () => writer.close()
            };
          }
        };
      }
    };
    let blob: Blob | undefined;
    const report = await syncWithFolder({
      storage: north,
      folder,
      appVersion: 'test',
      // As the page's export worker answers: the bytes and a Blob of them.
      writeFile: async (scope, identity, options) => {
        const file = await writeExport(north, scope, identity, options);
        blob = new Blob([file.bytes as BlobPart]);
        return { ...file, blob };
      }
    });
    expect(report.wrote).toBe(true);
    expect(written).toEqual([blob]);
    expect(written[0]).toBe(blob);
    const [name] = readdirSync(path);
    const { records } = await decodeExchangeFile(new Uint8Array(readFileSync(join(path, name!))));
    expect(records.sites.map((x) => x.name)).toEqual(['North Ridge']);
  });

  it('passes on fields written by a newer app version unchanged', async () => {
    const path = newFolder();
    const office = await device('Quality office');
    const north = await device('North lead');
    await north.sites.create({ name: 'North Ridge', timeZone: 'Europe/Oslo', region: 'North' });
    await sync(north, path);
    const [name] = readdirSync(path) as [string];
    const written = await decodeExchangeFile(new Uint8Array(readFileSync(join(path, name))));
    const sites = written.records.sites.map((s) => ({ ...s, plantCode: 'NR-7' }));
    const text = await exchangeText(
      changeSetOf(written.header, { ...written.records, sites: sites as never })
    );
    // The site's device runs a newer version: its file replaces the one written above.
    rmSync(join(path, name));
    writeFileSync(join(path, 'newer-app.capstan.json'), text);

    await sync(office, path);
    const ownFile = readdirSync(path).find((n) => n.startsWith('Quality-office-'))!;
    const passedOn = await decodeExchangeFile(new Uint8Array(readFileSync(join(path, ownFile))));
    expect((passedOn.records.sites[0] as unknown as { plantCode?: string }).plantCode).toBe('NR-7');
  });
});
