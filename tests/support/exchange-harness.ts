import { afterEach } from 'vitest';
import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import { prepareExport } from '../../src/lib/exchange/export-change-set';
import type { ExportScope } from '../../src/lib/storage/change-set-store';
import { openStorage, type CapstanStorage, databaseOf } from '../../src/lib/storage/storage';

/** Helpers for exchange tests on fake-indexeddb: devices are separately named databases. */
let counter = 0;

export async function openDevice(label: string): Promise<CapstanStorage> {
  counter += 1;
  return openStorage(`exchange-${label}-${counter}-${Math.random().toString(36).slice(2)}`);
}

export async function closeDevice(s: CapstanStorage): Promise<void> {
  databaseOf(s).close();
  await databaseOf(s).delete();
}

/** A test file's devices: `device(label)` opens one, and each is closed and deleted after every test. */
export function testDevices(): (label: string) => Promise<CapstanStorage> {
  const open: CapstanStorage[] = [];
  afterEach(async () => {
    while (open.length) await closeDevice(open.pop()!);
  });
  return async (label) => {
    const s = await openDevice(label);
    open.push(s);
    return s;
  };
}

/** The fixed identity used when a test compares two exports byte for byte. */
export const FIXED_IDENTITY = {
  appVersion: 'test',
  deviceName: 'reference',
  exportedAt: '2026-12-01T00:00:00.000Z'
};

export async function exportBytes(
  s: CapstanStorage,
  scope: ExportScope = { kind: 'everything' },
  identity = FIXED_IDENTITY
): Promise<Uint8Array> {
  return (await prepareExport(s, scope, identity, { peerName: 'peer' })).bytes;
}

/** A whole-database export whose header is forced to one fixed exporter, so only the records can differ. */
export async function canonicalExport(s: CapstanStorage): Promise<string> {
  const { changeSet } = await prepareExport(s, { kind: 'everything' }, FIXED_IDENTITY);
  changeSet.header.exportedBy.deviceId = 'reference-device';
  const { exchangeText } = await import('../../src/lib/exchange/exchange-file');
  return exchangeText(changeSet);
}

/** Decodes, previews and applies a file, settling conflicts by `rule` if given. */
export async function receiveBytes(
  s: CapstanStorage,
  bytes: Uint8Array,
  rule?: 'newer' | 'local' | 'incoming'
) {
  const changeSet = await decodeExchangeFile(bytes);
  const plan = await s.exchange.preview(changeSet.records);
  const result = await s.exchange.apply(plan, rule ? { rule } : {}, {
    deviceId: changeSet.header.exportedBy.deviceId,
    name: changeSet.header.exportedBy.deviceName,
    at: '2026-12-01T00:00:00.000Z'
  });
  return { plan, result, changeSet };
}

/** A site with one process and one measured characteristic (Seal force, 10–20 N), as a site lead sets them up. */
export async function sealingLine(s: CapstanStorage) {
  const plant = await s.sites.create({ name: 'Plant North', region: '', timeZone: 'UTC' });
  const process = await s.processes.create({
    siteId: plant.id,
    name: 'Sealing',
    owner: 'R. Imre',
    contextId: 'general-manufacturing',
    monthlyVolume: 1000,
    costPerDefective: 5,
    currency: 'EUR'
  });
  const ch = await s.characteristics.create({
    processId: process.id,
    name: 'Seal force',
    unit: 'N',
    dataKind: 'measured',
    lsl: 10,
    usl: 20,
    riskClass: 'standard'
  });
  return { plant, process, ch };
}
