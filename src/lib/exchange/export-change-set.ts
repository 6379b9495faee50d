import type { CapstanStorage } from '../storage/storage';
import type { ExportScope } from '../storage/change-set-store';
import { changeSetOf, encodeExchangeFile, exchangeFileName, type ChangeSet } from './exchange-file';
import type { ExportScopeHeader } from './exchange-schema';

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
 * the peer's checkpoint and this device's last-export time. (The page encodes in a worker in between.)
 */
export async function buildExport(
  storage: CapstanStorage,
  scope: ExportScope,
  identity: ExportIdentity,
  options: ExportOptions = {}
): Promise<{ changeSet: ChangeSet; fileName: string; remember: () => Promise<void> }> {
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
  const peer =
    scope.kind === 'changes' ? { deviceId: scope.peerId, name: options.peerName ?? '' } : undefined;
  return {
    changeSet,
    fileName: exchangeFileName(changeSet.header, options.gzip ?? false),
    remember: () => storage.exchange.recordExport(identity.exportedAt, collected, peer)
  };
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
