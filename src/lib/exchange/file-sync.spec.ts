import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it, vi } from 'vitest';
import demo from '../../../seed-data/demo-portfolio.json';
import {
  canonicalExport,
  exportBytes,
  FIXED_IDENTITY,
  receiveBytes,
  sealingLine,
  testDevices
} from '../../../tests/support/exchange-harness';
import { decodeExchangeFile, encodeExchangeFile, ExchangeFileError } from './exchange-file';
import { rememberExport, writeExport } from './export-change-set';

const device = testDevices();
afterEach(() => vi.restoreAllMocks());

describe('exchange files between devices', () => {
  it('round-trips the demo portfolio: export, import into an empty database, export again gives the same bytes', async () => {
    const a = await device('a');
    await a.loadDemo(demo);
    const file = await exportBytes(a);
    const b = await device('b');
    const { plan } = await receiveBytes(b, file);
    expect(plan.counts.new).toBe(demo.records.studies.length + 42 + 32 + 5 + 8 - plan.counts.deleted);
    expect(await canonicalExport(b)).toBe(await canonicalExport(a));
    // Importing the same file again changes nothing.
    const again = await receiveBytes(b, file);
    expect(again.plan.counts).toMatchObject({ new: 0, updated: 0, deleted: 0, conflict: 0 });
    expect(again.result.written).toBe(0);
  });

  it('verifies a re-indented file by its canonical form, and still catches a changed value in it', async () => {
    const a = await device('a');
    await a.sites.create({ name: 'Plant', region: 'North', timeZone: 'UTC' });
    const text = new TextDecoder().decode(await exportBytes(a));
    const pretty = JSON.stringify(JSON.parse(text), null, 2);
    expect(pretty).not.toBe(text);
    const reread = await decodeExchangeFile(new TextEncoder().encode(pretty));
    expect(reread).toEqual(await decodeExchangeFile(new TextEncoder().encode(text)));
    await expect(
      decodeExchangeFile(new TextEncoder().encode(pretty.replace('"North"', '"South"')))
    ).rejects.toThrow('content hash does not match');
  });

  it('verifies a file as written by its own bytes — with a byte-order mark, a trailing newline, names beyond ASCII — and catches one changed byte', async () => {
    const a = await device('a');
    await a.sites.create({ name: 'Usine Nord-Est — Zürich', region: 'Nørre', timeZone: 'UTC' });
    const bytes = await exportBytes(a);
    const wrapped = new Uint8Array([0xef, 0xbb, 0xbf, ...bytes, 0x0d, 0x0a]);
    // The canonical fallback must not be needed: spy on the one place it serialises again.
    const canonical = await import('../domain/canonical-json');
    const spy = vi.spyOn(canonical, 'canonicalJson');
    const reread = await decodeExchangeFile(wrapped);
    expect(reread.records.sites[0]?.name).toBe('Usine Nord-Est — Zürich');
    expect(reread).toEqual(await decodeExchangeFile(bytes));
    // The byte of the 'N' after the multi-byte characters before it: "Nørre" becomes "Mørre", still valid JSON.
    const text = new TextDecoder().decode(bytes);
    const at = new TextEncoder().encode(text.slice(0, text.indexOf('"Nørre"') + 1)).length;
    const changed = Uint8Array.from(bytes);
    expect(changed[at]).toBe('N'.charCodeAt(0));
    changed[at] = 'M'.charCodeAt(0);
    await expect(decodeExchangeFile(changed)).rejects.toThrow('content hash does not match');
    expect(spy).toHaveBeenCalledTimes(1); // only for the changed file, whose bytes did not match
  });

  it('carries quarterly reviews — notes and frozen figures — to another device', async () => {
    const a = await device('a');
    await a.loadDemo(demo);
    const { buildQuarterReview } = await import('../domain/quarter-review');
    const { BUILT_IN_PROFILES } = await import('../domain/context-profile');
    const figures = buildQuarterReview(await a.read.portfolioRecords(), BUILT_IN_PROFILES, {
      quarter: '2026-Q3'
    });
    await a.reviews.saveNote('2026-Q3', [], 'movers', 'Gate oxide improved for real.');
    await a.reviews.freeze('2026-Q3', [], figures, '2026-10-10T08:00:00.000Z');
    const b = await device('b');
    const { plan } = await receiveBytes(b, await exportBytes(a));
    expect(plan.countsByKind.reviews.new).toBe(1);
    const there = await b.reviews.find('2026-Q3', []);
    expect(there?.notes.movers).toBe('Gate oxide improved for real.');
    expect(there?.snapshot?.figures).toEqual(figures);
  });

  it('reads its own gzip-compressed files', async () => {
    const a = await device('a');
    await a.loadDemo(demo);
    const plain = await exportBytes(a);
    const changeSet = await decodeExchangeFile(plain);
    const packed = await encodeExchangeFile(changeSet, { gzip: true });
    expect(packed[0]).toBe(0x1f);
    expect(packed.byteLength).toBeLessThan(plain.byteLength / 3);
    expect(await decodeExchangeFile(packed)).toEqual(changeSet);
  });

  it('writes no file larger than a device reads, and says so', async () => {
    const a = await device('a');
    await a.loadDemo(demo);
    const plain = await exportBytes(a);
    const changeSet = await decodeExchangeFile(plain);
    // The file's own size as the bound passes; one byte less refuses, compressed or not.
    expect(await encodeExchangeFile(changeSet, { maxBytes: plain.byteLength })).toEqual(plain);
    for (const gzip of [false, true]) {
      const refused = encodeExchangeFile(changeSet, { gzip, maxBytes: plain.byteLength - 1 });
      await expect(refused).rejects.toBeInstanceOf(ExchangeFileError);
      await expect(refused).rejects.toThrow(
        /more than the .* Capstan reads: nothing was written — export per site/
      );
    }
  });

  it('plays a site and the manager: results go up, a target comes back, and a crossing edit is a conflict', async () => {
    const site = await device('site');
    const hq = await device('hq');
    const { plant, ch } = await sealingLine(site);
    await site.studies.logOne(
      {
        characteristicId: ch.id,
        period: '2026-11',
        data: { kind: 'summary', n: 50, mean: 15, sd: 1 },
        enteredBy: 'R. Imre'
      },
      'new'
    );
    const up = await receiveBytes(hq, await exportBytes(site, { kind: 'changes', peerId: hq.deviceId }));
    expect(up.plan.counts.new).toBe(4);

    // The manager tightens the limits and sends everything for that site back.
    await hq.characteristics.update(ch.id, { ...stripMeta(ch), usl: 19 });
    const down = await receiveBytes(site, await exportBytes(hq, { kind: 'site', siteId: plant.id }));
    expect(down.plan.counts).toMatchObject({ updated: 1, conflict: 0 });
    expect((await site.characteristics.get(ch.id))?.usl).toBe(19);
    expect(await canonicalExport(site)).toBe(await canonicalExport(hq));

    // Both now edit the same characteristic before meeting again.
    const hqCopy = (await hq.characteristics.get(ch.id))!;
    await hq.characteristics.update(ch.id, { ...stripMeta(hqCopy), name: 'Seal force (HQ)' });
    await site.characteristics.update(ch.id, { ...stripMeta(hqCopy), name: 'Seal force (site)' });
    const file = await exportBytes(site, { kind: 'changes', peerId: hq.deviceId });
    const changeSet = await decodeExchangeFile(file);
    const plan = await hq.exchange.preview(changeSet.records);
    expect(plan.conflicts).toHaveLength(1);
    expect(plan.conflicts[0]!.decision).toMatchObject({ nature: 'both-edited', fields: ['name'] });
    // Unsettled conflicts stop the import; nothing is written.
    const before = await canonicalExport(hq);
    await expect(
      hq.exchange.apply(plan, {}, { deviceId: site.deviceId, name: 'site', at: '2026-12-01T00:00:00Z' })
    ).rejects.toThrow(/not settled/);
    expect(await canonicalExport(hq)).toBe(before);
    // The manager keeps the site's name; sending back settles it on the site too.
    await hq.exchange.apply(
      plan,
      { perConflict: { [ch.id]: 'incoming' } },
      { deviceId: site.deviceId, name: 'site', at: '2026-12-01T00:00:00Z' }
    );
    expect((await hq.characteristics.get(ch.id))?.name).toBe('Seal force (site)');
    const back = await receiveBytes(site, await exportBytes(hq, { kind: 'changes', peerId: site.deviceId }));
    expect(back.plan.counts.conflict).toBe(0);
    expect(await canonicalExport(site)).toBe(await canonicalExport(hq));
  });

  it('a deletion on one side against an edit on the other is a conflict, not a loss or a resurrection', async () => {
    const a = await device('a');
    const b = await device('b');
    const s = await a.sites.create({ name: 'Plant West', region: '', timeZone: 'UTC' });
    await receiveBytes(b, await exportBytes(a));
    await a.sites.remove(s.id);
    await b.sites.update(s.id, { name: 'Plant West 2', region: '', timeZone: 'UTC' });
    const { plan } = await receiveBytes(b, await exportBytes(a), 'local');
    expect(plan.conflicts[0]!.nature).toBe('deleted-there');
    expect((await b.sites.get(s.id))?.name).toBe('Plant West 2');
    // Sending the settled record back restores it on the deleting side, as an explicit outcome.
    await receiveBytes(a, await exportBytes(b));
    expect((await a.sites.get(s.id))?.name).toBe('Plant West 2');
  });

  it('sends only what changed since the last file to that peer (plus a one-minute margin)', async () => {
    const a = await device('a');
    const start = Date.now();
    const clock = vi.spyOn(Date, 'now').mockReturnValue(start - 10 * 60_000); // the demo was loaded 10 min ago
    await a.loadDemo(demo);
    clock.mockReturnValue(start);
    const first = await decodeExchangeFile(await exportBytes(a, { kind: 'changes', peerId: 'peer-1' }));
    expect(first.header.counts.studies).toBe(demo.records.studies.length);
    clock.mockReturnValue(start + 5 * 60_000);
    const site = (await a.sites.list())[0]!;
    await a.sites.update(site.id, {
      name: `${site.name} (renamed)`,
      region: site.region,
      timeZone: site.timeZone
    });
    const second = await decodeExchangeFile(await exportBytes(a, { kind: 'changes', peerId: 'peer-1' }));
    expect(second.header.counts).toEqual({
      contextProfiles: 0,
      sites: 1,
      processes: 0,
      characteristics: 0,
      studies: 0,
      projects: 0,
      reviews: 0
    });
    expect(second.header.scope).toMatchObject({ kind: 'changes', recipient: { deviceId: 'peer-1' } });
    // Another peer has had nothing yet, so it gets everything.
    const other = await decodeExchangeFile(await exportBytes(a, { kind: 'changes', peerId: 'peer-2' }));
    expect(other.header.counts.studies).toBe(demo.records.studies.length);
  });

  it('writes a file in one go as the page’s worker does, and remembers it only when told the file was handed over', async () => {
    const a = await device('a');
    const start = Date.now();
    const clock = vi.spyOn(Date, 'now').mockReturnValue(start - 10 * 60_000);
    await a.loadDemo(demo);
    clock.mockReturnValue(start);
    const scope = { kind: 'changes', peerId: 'peer-1' } as const;
    const options = { peerName: 'peer' };
    // The same bytes as the collect-encode-remember path gives (the command line's, prepareExport).
    const file = await writeExport(a, scope, FIXED_IDENTITY, options);
    expect(file.bytes).toEqual(await exportBytes(a, scope));
    expect(file.counts.studies).toBe(demo.records.studies.length);
    expect(file.fileName).toMatch(/\.json$/);
    // exportBytes above remembered its own file: start again with a fresh device for the checkpoint.
    const b = await device('b');
    clock.mockReturnValue(start - 10 * 60_000);
    await b.loadDemo(demo);
    clock.mockReturnValue(start);
    const unsent = await writeExport(b, scope, FIXED_IDENTITY, options);
    // Not handed over, not remembered: the next file to the same peer carries everything again.
    const again = await writeExport(b, scope, FIXED_IDENTITY, options);
    expect(again.counts).toEqual(unsent.counts);
    await rememberExport(b, again, scope, FIXED_IDENTITY, options);
    clock.mockReturnValue(start + 5 * 60_000);
    const after = await writeExport(b, scope, FIXED_IDENTITY, options);
    expect(after.counts.studies).toBe(0);
  });

  it('refuses an id that this device holds as another kind of record, writing nothing', async () => {
    const a = await device('a');
    const b = await device('b');
    const s = await a.sites.create({ name: 'Plant', region: '', timeZone: 'UTC' });
    await b.loadDemo(demo);
    const changeSet = await decodeExchangeFile(await exportBytes(a));
    const processId = demo.records.processes[0]!.id;
    changeSet.records.sites[0] = { ...changeSet.records.sites[0]!, id: processId };
    await expect(b.exchange.preview(changeSet.records)).rejects.toThrow(
      `site ${processId} in the file is a process on this device`
    );
    expect(s.id).not.toBe(processId);
    expect(ExchangeFileError).toBeDefined();
  });

  it('shows how long changes have gone without an export', async () => {
    const a = await device('a');
    expect((await a.exchange.backupStatus()).unexported).toBe(0);
    await a.sites.create({ name: 'Plant', region: '', timeZone: 'UTC' });
    const status = await a.exchange.backupStatus();
    expect(status).toMatchObject({ unexported: 1, lastExportAt: undefined });
    expect(Date.parse(status.oldestUnexportedAt!)).toBeLessThanOrEqual(Date.now());
    await exportBytes(a);
    expect(await a.exchange.backupStatus()).toMatchObject({
      unexported: 0,
      lastExportAt: '2026-12-01T00:00:00.000Z'
    });
  });
});

function stripMeta<T extends object>(r: T) {
  const out = { ...r } as Record<string, unknown>;
  for (const k of ['id', 'createdAt', 'updatedAt', 'rev', 'deviceId', 'deletedAt', 'vv', 'clock', 'localSeq'])
    delete out[k];
  return out;
}
