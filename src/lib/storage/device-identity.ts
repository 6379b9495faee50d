import { HybridClock, isClockStamp } from '../domain/hybrid-clock';
import type { WriteContext } from '../domain/record-meta';
import type { CapstanDatabase } from './database';

const DEVICE_ID_KEY = 'deviceId';
const DEVICE_NAME_KEY = 'deviceName';

/**
 * Returns this device's id, creating it on first use. The id is stored with the data, so clearing site data
 * gives a new device — which is right: the old device's writes are then someone else's.
 */
export async function loadDeviceId(db: CapstanDatabase): Promise<string> {
  return db.transaction('rw', db.deviceSettings, async () => {
    const existing = await db.deviceSettings.get(DEVICE_ID_KEY);
    if (typeof existing?.value === 'string') return existing.value;
    const id = crypto.randomUUID();
    await db.deviceSettings.put({ key: DEVICE_ID_KEY, value: id });
    return id;
  });
}

/** The name of the person using this device, recorded on each study they enter. Empty until set. */
export async function loadDeviceName(db: CapstanDatabase): Promise<string> {
  const row = await db.deviceSettings.get(DEVICE_NAME_KEY);
  return typeof row?.value === 'string' ? row.value : '';
}

export async function saveDeviceName(db: CapstanDatabase, name: string): Promise<string> {
  const trimmed = name.trim().slice(0, 120);
  await db.deviceSettings.put({ key: DEVICE_NAME_KEY, value: trimmed });
  return trimmed;
}

const CLOCK_KEY = 'clock';

/**
 * This device's hybrid clock, resumed from the latest stamp saved (on every import and export). Stamps issued
 * between saves are not lost: each write is also stamped after the version it edits.
 */
export async function loadClock(db: CapstanDatabase, deviceId: string): Promise<HybridClock> {
  const row = await db.deviceSettings.get(CLOCK_KEY);
  return new HybridClock(deviceId, () => Date.now(), isClockStamp(row?.value) ? row.value : undefined);
}

export async function saveClock(db: CapstanDatabase, clock: HybridClock): Promise<void> {
  if (clock.latest !== undefined) await db.deviceSettings.put({ key: CLOCK_KEY, value: clock.latest });
}

export function writeContextFor(deviceId: string, clock?: HybridClock): WriteContext {
  return { deviceId, now: () => new Date(), newId: () => crypto.randomUUID(), clock };
}
