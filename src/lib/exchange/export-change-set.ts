import type { CapstanStorage } from '../storage/storage';
import type { ExportScope } from '../storage/change-set-store';
import { changeSetOf, encodeExchangeFile, exchangeFileName, type ChangeSet } from './exchange-file';
import type { ExportScopeHeader } from './exchange-schema';

/** What a file covers (storage/change-set-store.ts), for the callers of writeExport that do not reach storage. */
export type { ExportScope };

export interface PreparedExport {
  changeSet: ChangeSet;
  bytes: Uint8Array;
  fileName: string;
}

/** Who exports, and when: given by the caller so that tests (and the CLI) can fix them. */
export interface ExportIdentity {
  appVersion: string;
  deviceName: string;
  exportedAt: string;
}

/**
 * Exports: a scope collected into a change set and its file bytes, and the export remembered (the peer's
 * checkpoint and this device's last export time). Reading and writing the checkpoint go through storage; this
 * module only turns the change set into a file.
 */
export interface ExportOptions {
  gzip?: boolean;
  peerName?: string;
  siteName?: string;
}

/**
 * The change set a scope covers, and `remember`, to be called once the file has been handed over: it moves
 * the peer's checkpoint and this device's last-export time (rememberExport). The page's exports run writeExport
 * in a worker instead.
 */
export async function buildExport(
  storage: CapstanStorage,
  scope: ExportScope,
  identity: ExportIdentity,
  options: ExportOptions = {}
): Promise<{ changeSet: ChangeSet; fileName: string; highWater: number; remember: () => Promise<void> }> {
  const collected = await storage.exchange.collect(scope);
  let scopeHeader: ExportScopeHeader;
  if (scope.kind === 'site')
    scopeHeader = { kind: 'site', siteId: scope.siteId, siteName: options.siteName ?? '' };
  else if (scope.kind === 'changes') {
    scopeHeader = {
      kind: 'changes',
      recipient: { deviceId: scope.peerId, name: options.peerName ?? '' },
      ...(collected.since !== undefined ? { since: new Date(collected.since).toISOString() } : {})
    };
  } else scopeHeader = { kind: 'everything' };
  const changeSet = changeSetOf(
    {
      appVersion: identity.appVersion,
      exportedBy: { deviceId: storage.deviceId, deviceName: identity.deviceName },
      exportedAt: identity.exportedAt,
      scope: scopeHeader
    },
    collected.records
  );
  return {
    changeSet,
    fileName: exchangeFileName(changeSet.header, options.gzip ?? false),
    highWater: collected.highWater,
    remember: () => rememberExport(storage, collected, scope, identity, options)
  };
}

/** A file written from a scope (writeExport): its bytes, its name, its header's counts and its high-water mark. */
export interface ExportedFile {
  bytes: Uint8Array;
  /**
   * The same file as a Blob of its media type (exchangeMediaType), made where it was written: the exchange worker
   * sends it with the bytes, and the page downloads it without copying them (the copy was one task of 37–116 ms on
   * the page for a company's file of 20 000 processes).
   */
  blob?: Blob;
  fileName: string;
  counts: ChangeSet['header']['counts'];
  /** The highest write sequence it holds (CollectedChanges.highWater): what remembering it moves the checkpoint to. */
  highWater: number;
}

/** Media type of an exchange file as written: gzip-compressed or plain JSON. */
export function exchangeMediaType(gzip: boolean | undefined): string {
  return gzip ? 'application/gzip' : 'application/json';
}

/**
 * A scope collected and written as a file in one go, nothing remembered: what the exchange worker runs
 * (workers/exchange-file.worker.ts), so that a company's records never pass through the page — collecting
 * 72 000 studies there, then copying them to the encoding worker, held it for three tasks of 0.6–0.9 s each with
 * the CPU throttled 4×. `onWriting` hears when collecting ends and writing starts. Call rememberExport once
 * the file is handed over.
 */
export async function writeExport(
  storage: CapstanStorage,
  scope: ExportScope,
  identity: ExportIdentity,
  options: ExportOptions = {},
  onWriting: () => void = () => undefined
): Promise<ExportedFile> {
  const built = await buildExport(storage, scope, identity, options);
  onWriting();
  return {
    bytes: await encodeExchangeFile(built.changeSet, { gzip: options.gzip }),
    fileName: built.fileName,
    counts: built.changeSet.header.counts,
    highWater: built.highWater
  };
}

/**
 * Remembers a file handed over: the recipient's checkpoint (the `changes` scope) and this device's last-export
 * time move to what it holds. Only once it is handed over: remembered earlier, a file that was never delivered
 * would leave its changes out of the next one to the same recipient.
 */
export function rememberExport(
  storage: CapstanStorage,
  file: { highWater: number },
  scope: ExportScope,
  identity: ExportIdentity,
  options: ExportOptions = {}
): Promise<void> {
  const peer =
    scope.kind === 'changes' ? { deviceId: scope.peerId, name: options.peerName ?? '' } : undefined;
  return storage.exchange.recordExport(identity.exportedAt, file, peer);
}

/** Collects, encodes and remembers in one go (command line, tests). */
export async function prepareExport(
  storage: CapstanStorage,
  scope: ExportScope,
  identity: ExportIdentity,
  options: ExportOptions = {}
): Promise<PreparedExport> {
  const built = await buildExport(storage, scope, identity, options);
  const bytes = await encodeExchangeFile(built.changeSet, { gzip: options.gzip });
  await built.remember();
  return { changeSet: built.changeSet, bytes, fileName: built.fileName };
}
