import type { MergeChoices, MergeConflict } from '../domain/change-set-merge';
import { summariseConflict, type ConflictSummary } from '../domain/conflict-summary';
import type { RecordKind } from '../domain/record-kinds';
import type { MergeKind } from '../domain/record-merge';
import type { ReceiveResult } from '../storage/change-set-store';
import type { CapstanStorage, WriteMarks } from '../storage/storage';
import type { ChangeSet } from './exchange-file';

/** Conflicts put into words for the person (the rest are settled by the rule they choose). */
export const SHOWN_CONFLICTS = 200;

/**
 * What a received file would do, as plain data: it crosses from the worker that read and compared the file to
 * the page, which never holds the file's records (at company size, hundreds of thousands of them and a
 * gigabyte of the page's memory).
 */
export interface ReceivePreview {
  header: ChangeSet['header'];
  counts: Record<MergeKind, number>;
  countsByKind: Record<RecordKind, Record<MergeKind, number>>;
  warnings: string[];
  /** Every conflict's key (the key of its choice) and type, in the plan's order. */
  conflicts: Pick<MergeConflict, 'key' | 'type'>[];
  /** The first SHOWN_CONFLICTS conflicts in words. */
  shown: (Pick<MergeConflict, 'key' | 'type'> & { summary: ConflictSummary })[];
}

/** A merge's counts, and where the device's write sequence and clock stand after it. */
export type MergeOutcome = ReceiveResult & { marks: WriteMarks };

/**
 * A received change set, compared with this device and waiting for the person's decision. The same steps
 * whether they run in a worker (the app) or in the caller's thread (tests, folder sync given no worker).
 */
export interface ReceiveSession {
  preview: ReceivePreview;
  /** Writes the merge in one transaction (storage/change-set-store.ts applyChangeSet). */
  merge(
    choices: MergeChoices,
    source: { deviceId: string; name: string; at: string },
    onWritten?: (written: number, total: number) => void
  ): Promise<MergeOutcome>;
  /** Lets go of the file (nothing was written, or the merge is done). */
  close(): void;
}

/** A device as the person knows it: this one, a peer by the name it gave, else the start of its id. */
function deviceNamer(
  storage: CapstanStorage,
  names: ReadonlyMap<string, string>
): (deviceId: string) => string {
  return (id) =>
    id === storage.deviceId ? 'this device' : names.get(id) ? `${names.get(id)}` : `device ${id.slice(0, 8)}`;
}

/** Compares a decoded change set with the records stored here (nothing is written until `merge`). */
export async function receiveChangeSet(
  storage: CapstanStorage,
  changeSet: ChangeSet
): Promise<ReceiveSession> {
  const plan = await storage.exchange.preview(changeSet.records);
  const peers = await storage.exchange.peers();
  const exporter = changeSet.header.exportedBy;
  const names = new Map([
    ...peers.map((p) => [p.deviceId, p.name] as [string, string]),
    [exporter.deviceId, exporter.deviceName]
  ]);
  const lookup = (id: string) => plan.snapshot.record(id) ?? plan.incoming.get(id)?.record;
  const named = deviceNamer(storage, names);
  const preview: ReceivePreview = {
    header: changeSet.header,
    counts: plan.counts,
    countsByKind: plan.countsByKind,
    warnings: plan.warnings,
    conflicts: plan.conflicts.map(({ key, type }) => ({ key, type })),
    shown: plan.conflicts
      .slice(0, SHOWN_CONFLICTS)
      .map((c) => ({ key: c.key, type: c.type, summary: summariseConflict(c, lookup, named) }))
  };
  let closed = false;
  return {
    preview,
    merge: async (choices, source, onWritten) => {
      if (closed) throw new Error('This file was discarded: read it again to merge it');
      const result = await storage.exchange.apply(plan, choices, source, onWritten);
      closed = true;
      return {
        ...result,
        marks: { writeMark: storage.syncFolder.writeMark(), latestStamp: storage.clock.latest }
      };
    },
    close: () => {
      closed = true;
    }
  };
}
