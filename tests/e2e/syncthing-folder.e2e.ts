import 'fake-indexeddb/auto';
import { expect, test } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { syncWithFolder } from '../../src/lib/exchange/folder-sync';
import { closeDevice, openDevice } from '../support/exchange-harness';
import { nodeDirectoryHandle } from '../support/node-directory-handle';
import { startSyncthingPair } from '../support/syncthing-pair';

/**
 * A real file-sync engine between two folders: two Syncthing instances on loopback (syncthing-pair.ts). A site
 * device writes its file into one folder with the app's folder transport; Syncthing carries it to the other,
 * where the office's `gather` merges it, and so does the app's folder transport handed that folder. The
 * devices are the app's storage on fake-indexeddb in Node, and the folder is handed over as a directory handle
 * on disk (node-directory-handle.ts), because a browser's folder picker cannot be driven by a test. The
 * instances are stopped by their process ids, and every wait is bounded.
 */
const CLI = fileURLToPath(new URL('../../src/build/cli.mjs', import.meta.url));
const WAIT_MS = 90_000;

async function waitUntil(what: string, check: () => boolean): Promise<void> {
  const started = Date.now();
  while (!check()) {
    if (Date.now() - started > WAIT_MS)
      throw new Error(`Syncthing did not ${what} within ${WAIT_MS / 1000} s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** The same file, complete, in the other folder (Syncthing renames it into place when it is whole). */
const arrived = (from: string, to: string, name: string) => () =>
  existsSync(join(to, name)) && statSync(join(to, name)).size === statSync(join(from, name)).size;

const exchangeFiles = (folder: string) => readdirSync(folder).filter((n) => n.endsWith('.capstan.json.gz'));

test('a site file crosses a real Syncthing pair; gather and the app folder transport both merge it', async () => {
  test.setTimeout(240_000);
  const work = mkdtempSync(join(tmpdir(), 'capstan-syncthing-'));
  const pair = await startSyncthingPair(work);
  const [siteFolder, officeFolder] = pair.folders;
  const site = await openDevice('syncthing-site');
  const office = await openDevice('syncthing-office');
  try {
    expect(pair.pids).toHaveLength(2);
    await site.setDeviceName('North Ridge lead');
    const created = await site.sites.create({
      name: 'North Ridge',
      region: 'North',
      timeZone: 'Europe/Oslo'
    });
    const written = await syncWithFolder({
      storage: site,
      folder: nodeDirectoryHandle(siteFolder),
      appVersion: 'test'
    });
    expect(written.wrote).toBe(true);
    const [siteFile] = exchangeFiles(siteFolder) as [string];
    expect(siteFile).toMatch(/^North-Ridge-lead-/);

    await waitUntil('carry the site file', arrived(siteFolder, officeFolder, siteFile));

    // The office's gather merges what arrived.
    const out = join(work, 'gathered.capstan.json');
    const gathered = spawnSync(process.execPath, [CLI, 'gather', officeFolder, '-o', out], {
      encoding: 'utf8'
    });
    expect(gathered.stderr).toBe('');
    expect(gathered.status).toBe(0);
    const records = (await decodeExchangeFile(new Uint8Array(readFileSync(out)))).records;
    expect(records.sites.map((s) => s.id)).toEqual([created.id]);

    // So does the app's folder transport, handed the office's folder; its own file goes back the same way.
    await office.setDeviceName('Quality office');
    const report = await syncWithFolder({
      storage: office,
      folder: nodeDirectoryHandle(officeFolder),
      appVersion: 'test'
    });
    expect(report.merged.map((f) => [f.name, f.deviceName, f.counts?.new])).toEqual([
      [siteFile, 'North Ridge lead', 1]
    ]);
    expect((await office.sites.list()).map((s) => s.name)).toEqual(['North Ridge']);
    const officeFile = exchangeFiles(officeFolder).find((n) => n.startsWith('Quality-office-'))!;
    await waitUntil('carry the office file back', arrived(officeFolder, siteFolder, officeFile));
    const back = await syncWithFolder({
      storage: site,
      folder: nodeDirectoryHandle(siteFolder),
      appVersion: 'test'
    });
    expect(back.merged.map((f) => f.deviceName)).toEqual(['Quality office']);
    expect(back.skipped).toEqual([]);
  } finally {
    await pair.stop();
    for (const pid of pair.pids) expect(() => process.kill(pid, 0)).toThrow();
    await closeDevice(site);
    await closeDevice(office);
    rmSync(work, { recursive: true, force: true });
  }
});
