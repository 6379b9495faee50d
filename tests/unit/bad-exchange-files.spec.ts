import 'fake-indexeddb/auto';
import { readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import demo from '../../seed-data/demo-portfolio.json';
import { decodeExchangeFile } from '../../src/lib/exchange/exchange-file';
import type { CapstanStorage } from '../../src/lib/storage/storage';
import { canonicalExport, closeDevice, openDevice } from '../support/exchange-harness';

/**
 * Every file of the bad-file corpus (tests/fixtures/bad-exchange-files, made by make-corpus.ts) is offered to a
 * device holding the demo portfolio the way the app offers it: read and check the file, preview, apply. Each
 * must be refused with one line that names the problem, and a whole-database export taken before and after
 * must be byte-for-byte the same.
 */
const dir = new URL('../fixtures/bad-exchange-files/', import.meta.url);
const manifest = JSON.parse(readFileSync(new URL('manifest.json', dir), 'utf8')) as {
  file: string;
  expect: string;
  why: string;
}[];

let device: CapstanStorage;
let before: string;

beforeAll(async () => {
  device = await openDevice('bad-files');
  await device.loadDemo(demo);
  before = await canonicalExport(device);
});
afterAll(async () => closeDevice(device));

async function offer(bytes: Uint8Array): Promise<string> {
  try {
    const changeSet = await decodeExchangeFile(bytes);
    const plan = await device.exchange.preview(changeSet.records);
    await device.exchange.apply(plan, {}, { deviceId: 'x', name: 'x', at: '2026-12-01T00:00:00Z' });
  } catch (e) {
    return e instanceof Error ? e.message : String(e);
  }
  return 'ACCEPTED';
}

describe('bad exchange files', () => {
  it('has at least 40 files in the corpus', () => {
    expect(manifest.length).toBeGreaterThanOrEqual(40);
  });

  for (const entry of manifest) {
    it(`refuses ${entry.file} (${entry.why}) with one clear line and no change`, async () => {
      const message = await offer(new Uint8Array(readFileSync(new URL(entry.file, dir))));
      expect(message).toContain(entry.expect);
      expect(message).not.toContain('\n');
      expect(message, 'no control character from the file reaches the message').not.toMatch(
        // eslint-disable-next-line no-control-regex
        /[\u0000-\u001f\u007f-\u009f]/
      );
      expect(message.length).toBeLessThan(400);
      expect(await canonicalExport(device)).toBe(before);
    });
  }

  it('refuses a 600 MB file by its size, before reading it', async () => {
    // Zero-filled: the pages are never touched, as the size is checked before anything is read.
    const big = new Uint8Array(600 * 1024 * 1024);
    big[0] = 0x7b; // "{"
    const message = await offer(big);
    expect(message).toContain('The file is 600.0 MB; Capstan reads exchange files up to 512.0 MB');
    expect(await canonicalExport(device)).toBe(before);
  });

  it('refuses a compressed file whose stated size lies, by the bytes it unpacks to', async () => {
    // 600 MB of spaces whose gzip trailer says 0 bytes (RFC 1952 ISIZE): the early check passes it, the bound
    // on what is unpacked refuses it.
    const bomb = new Uint8Array(gzipSync(Buffer.alloc(600 * 1024 * 1024, 0x20), { level: 1 }));
    bomb.fill(0, bomb.byteLength - 4);
    const message = await offer(bomb);
    expect(message).toContain('The compressed file unpacks to more than 512.0 MB');
    expect(await canonicalExport(device)).toBe(before);
  }, 60_000);

  it('leaves the prototype of plain objects untouched after the __proto__ files', () => {
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(({} as Record<string, unknown>).isAdmin).toBeUndefined();
  });
});
