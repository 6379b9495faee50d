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
 * Collects a scope into a change set and its file bytes, and remembers the export (the peer's checkpoint and
 * this device's last export time). Reading and writing the checkpoint go through storage; this module only
 * turns the change set into a file.
 */
export async function prepareExport(
  storage: CapstanStorage,
  scope: ExportScope,
  identity: ExportIdentity,
  options: { gzip?: boolean; peerName?: string; siteName?: string } = {}
): Promise<PreparedExport> {
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
  const bytes = await encodeExchangeFile(changeSet, { gzip: options.gzip });
  const peer =
    scope.kind === 'changes' ? { deviceId: scope.peerId, name: options.peerName ?? '' } : undefined;
  await storage.exchange.recordExport(identity.exportedAt, collected, peer);
  return { changeSet, bytes, fileName: exchangeFileName(changeSet.header, options.gzip ?? false) };
}
