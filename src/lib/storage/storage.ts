import type { DexieOptions } from 'dexie';
import { createCharacteristicRepository, type CharacteristicRepository } from './characteristic-repository';
import { CapstanDatabase, DEFAULT_DATABASE_NAME } from './database';
import type { HybridClock } from '../domain/hybrid-clock';
import type { RecordKind, RecordsByKind } from '../domain/record-kinds';
import { loadBackupStatus, type BackupStatus } from './backup-status';
import type { MergeChoices } from '../domain/change-set-merge';
import type { ExistingPortfolio, MasterListPlan, masterListCounts } from '../domain/master-list';
import type { ReportingCurrency } from '../domain/reporting-currency';
import type {
  CollectedChanges,
  ExportScope,
  ReceivePlan,
  ReceiveResult,
  PeerRecord
} from './change-set-store';
import {
  loadFolderHandle,
  loadFolderSyncState,
  saveFolderHandle,
  saveFolderSyncState,
  type FolderSyncState
} from './folder-sync-state';
import { loadClock, loadDeviceId, loadDeviceName, saveDeviceName, writeContextFor } from './device-identity';
import { ContextProfileRepository } from './context-profile-repository';
import { EntryDraftRepository } from './entry-draft-repository';
import { createImprovementProjectRepository, type ProjectRepository } from './improvement-project-repository';
import { createProcessRepository, type ProcessRepository } from './process-repository';
import type { MonthSettlement, PendingMonth } from './month-clash-repository';
import { QuarterReviewRepository } from './quarter-review-repository';
import { CURRENT_SCHEMA_VERSION } from './schema-versions';
import { BLOCKED_MESSAGE, explainOpenError, explainStorageError } from './storage-errors';
import { SiteRepository } from './site-repository';
import { StudyRepository } from './study-repository';
import {
  isDemoPresent,
  isPortfolioEmpty,
  loadDemoPortfolio,
  removeDemoPortfolio,
  type DemoLoadResult
} from './demo-portfolio-loader';
import { loadMonthlyLogStatus, type MonthlyLogStatus } from './monthly-log-status';
import {
  latestLiveMonths,
  listProcessOverviews,
  loadPortfolioRecords,
  portfolioChangeMark,
  recordsChangeMark,
  loadProcessDetail,
  type ProcessDetail,
  type ProcessOverview
} from './portfolio-overview';

/**
 * Everything the app may do with stored data, as typed repositories over one open database. The database itself
 * is not part of it: pages and components never touch tables (tests, tools and benchmarks reach it through
 * `databaseOf`, which lint forbids in UI code and pages).
 */
export interface CapstanStorage {
  readonly deviceId: string;
  /** The IndexedDB database's name: what a reading worker opens (storage/portfolio-reader.ts). */
  readonly databaseName: string;
  readonly sites: SiteRepository;
  readonly processes: ProcessRepository;
  readonly characteristics: CharacteristicRepository;
  readonly studies: StudyRepository;
  readonly projects: ProjectRepository;
  readonly drafts: EntryDraftRepository;
  readonly profiles: ContextProfileRepository;
  readonly reviews: QuarterReviewRepository;
  /** The master list: the live sites, processes and characteristics to plan against, and applying a plan. */
  readonly masterList: {
    existing(): Promise<ExistingPortfolio>;
    apply(plan: MasterListPlan): Promise<ReturnType<typeof masterListCounts>>;
  };
  /** Months holding two live studies from before schema v7, waiting for a person (pending conflicts). */
  readonly monthClashes: {
    list(): Promise<PendingMonth[]>;
    settle(key: string, choice: MonthSettlement): Promise<void>;
  };
  /** Read models for the pages; each is safe to run inside a live query. */
  readonly read: {
    processOverviews(): Promise<ProcessOverview[]>;
    /** The latest month with a live study of each of these characteristics (none: left out). */
    latestMonths(characteristicIds: readonly string[]): Promise<Map<string, string>>;
    portfolioRecords(): ReturnType<typeof loadPortfolioRecords>;
    /** Changes whenever a record of the portfolio is written (portfolio-overview.ts); reads no records. */
    portfolioChangeMark(): ReturnType<typeof portfolioChangeMark>;
    processDetail(processId: string): Promise<ProcessDetail | undefined>;
    monthlyLogStatus(siteId: string, period: string): Promise<MonthlyLogStatus>;
    /** Changes whenever a record `summary` counts is written (portfolio-overview.ts); reads no records. */
    recordsChangeMark(): Promise<string>;
    isEmpty(): Promise<boolean>;
  };
  /** Change sets for file exchange (or any later transport). */
  readonly exchange: {
    collect(scope: ExportScope): Promise<CollectedChanges>;
    /** Remembers a file handed over; of what was collected, only its high-water mark is read. */
    recordExport(
      at: string,
      collected: Pick<CollectedChanges, 'highWater'>,
      peer?: { deviceId: string; name: string }
    ): Promise<void>;
    preview(records: RecordsByKind): Promise<ReceivePlan>;
    /** `onWritten` hears how many of the merge's records are written so far, after each part (for a progress line). */
    apply(
      plan: ReceivePlan,
      choices: MergeChoices,
      source: { deviceId: string; name: string; at: string },
      onWritten?: (written: number, total: number) => void
    ): Promise<ReceiveResult>;
    /**
     * A merge written by another thread of this app (the exchange worker): this storage's clock and write
     * sequence carry on above what that merge used, as they do after a merge of their own.
     */
    mergedElsewhere(marks: WriteMarks): void;
    peers(): Promise<PeerRecord[]>;
    backupStatus(): Promise<BackupStatus>;
    reminderDays(): Promise<number>;
    setReminderDays(days: number): Promise<number>;
  };
  /** The shared sync folder: its stored handle and what the last syncs saw (device-local). */
  readonly syncFolder: {
    handle(): Promise<unknown>;
    /** Undefined forgets the folder and what was seen in it. */
    setHandle(handle: unknown): Promise<void>;
    state(): Promise<FolderSyncState>;
    saveState(state: FolderSyncState): Promise<void>;
    /** This device's write sequence so far: it grows with every record written here, typed or merged. */
    writeMark(): number;
  };
  readonly clock: HybridClock;
  loadDemo(file: unknown): Promise<DemoLoadResult>;
  /** Whether the invented demo portfolio is loaded (safe inside a live query). */
  demoPresent(): Promise<boolean>;
  /** Removes the demo with everything under its sites; the user's own records are not touched. */
  removeDemo(): Promise<Partial<Record<RecordKind, number>>>;
  deviceName(): Promise<string>;
  setDeviceName(name: string): Promise<string>;
  /** The reporting currency and exchange rates of this device's reviews (device-local; undefined: none set). */
  reportingCurrency(): Promise<ReportingCurrency | undefined>;
  /** Validates and saves it (ValidationError names the field); undefined clears it. */
  setReportingCurrency(value: unknown): Promise<ReportingCurrency | undefined>;
  close(): void;
}

const changeSets = () => import('./change-set-store');

/**
 * Where this device's write sequence and clock stand, as one thread tells another after writing: the storage of
 * the other thread carries on above them.
 */
export interface WriteMarks {
  writeMark: number;
  latestStamp: string | undefined;
}

const databases = new WeakMap<CapstanStorage, CapstanDatabase>();

/** The database behind a storage object: for tests, tools and benchmarks only (lint keeps it out of UI code). */
export function databaseOf(storage: CapstanStorage): CapstanDatabase {
  const db = databases.get(storage);
  if (!db) throw new Error('This storage object was not opened by openStorage');
  return db;
}

/**
 * Dexie 4 opens a database of a higher version than it declares, adding what it misses: that would let this app
 * write into data shaped by a newer one. So the stored version is read first (without opening or creating
 * anything) and a newer database is refused. Dexie stores version v as native version 10·v.
 */
async function refuseNewerDatabase(name: string, options?: DexieOptions): Promise<void> {
  const factory = (options?.indexedDB ?? globalThis.indexedDB) as IDBFactory | undefined;
  if (!factory || typeof factory.databases !== 'function') return;
  const stored = (await factory.databases()).find((d) => d.name === name);
  if (stored?.version !== undefined && stored.version >= (CURRENT_SCHEMA_VERSION + 1) * 10) {
    throw explainOpenError(
      new DOMException(`stored database version ${stored.version / 10}`, 'VersionError')
    );
  }
}

const REMINDER_KEY = 'backupReminderDays';
const REPORTING_CURRENCY_KEY = 'reportingCurrency';
/** Nudge after a week of changes that are in no file: a month's logging is then at most a week at risk. */
const DEFAULT_REMINDER_DAYS = 7;

/** Opens (creating or upgrading) the database and binds the repositories to this device. */
export async function openStorage(
  name: string = DEFAULT_DATABASE_NAME,
  options?: DexieOptions,
  events: { onBlocked?: (message: string) => void } = {}
): Promise<CapstanStorage> {
  await refuseNewerDatabase(name, options);
  const db = new CapstanDatabase(name, options);
  // An older tab that does not let go of the database makes the upgrade wait; say so, and carry on when it closes.
  db.on('blocked', () => events.onBlocked?.(BLOCKED_MESSAGE));
  try {
    await db.open();
  } catch (error) {
    db.close();
    throw explainOpenError(error);
  }

  const deviceId = await loadDeviceId(db);
  const clock = await loadClock(db, deviceId);
  const ctx = writeContextFor(deviceId, clock);
  const storage: CapstanStorage = {
    deviceId,
    databaseName: name,
    clock,
    sites: new SiteRepository(db, ctx),
    processes: createProcessRepository(db, ctx),
    characteristics: createCharacteristicRepository(db, ctx),
    studies: new StudyRepository(db, ctx),
    projects: createImprovementProjectRepository(db, ctx),
    drafts: new EntryDraftRepository(db),
    profiles: new ContextProfileRepository(db, ctx),
    reviews: new QuarterReviewRepository(db, ctx),
    masterList: {
      existing: async () => ({
        sites: (await db.sites.toArray()).filter((r) => !r.deletedAt),
        processes: (await db.processes.toArray()).filter((r) => !r.deletedAt),
        characteristics: (await db.characteristics.toArray()).filter((r) => !r.deletedAt)
      }),
      apply: async (plan) => {
        try {
          return await (await import('./master-list-store')).applyMasterList(db, ctx, plan);
        } catch (error) {
          throw explainStorageError(error, 'The master list');
        }
      }
    },
    // Loaded on first use: only the File exchange page lists pending months.
    monthClashes: {
      list: async () => new (await import('./month-clash-repository')).MonthClashRepository(db, ctx).list(),
      settle: async (key, choice) =>
        new (await import('./month-clash-repository')).MonthClashRepository(db, ctx).settle(key, choice)
    },
    read: {
      processOverviews: () => listProcessOverviews(db),
      latestMonths: (characteristicIds) => latestLiveMonths(db, characteristicIds),
      portfolioRecords: () => loadPortfolioRecords(db),
      portfolioChangeMark: () => portfolioChangeMark(db),
      processDetail: (processId) => loadProcessDetail(db, processId),
      monthlyLogStatus: (siteId, period) => loadMonthlyLogStatus(db, siteId, period),
      recordsChangeMark: () => recordsChangeMark(db),
      isEmpty: () => isPortfolioEmpty(db)
    },
    exchange: {
      // Loaded on first use: merging is not needed to show the first page.
      collect: async (scope) => (await changeSets()).collectChanges(db, scope),
      recordExport: async (at, collected, peer) =>
        (await changeSets()).recordExport(db, clock, at, collected, peer),
      preview: async (records) => (await changeSets()).previewChangeSet(db, records),
      apply: async (plan, choices, source, onWritten) => {
        try {
          return await (await changeSets()).applyChangeSet(db, plan, choices, ctx, clock, source, onWritten);
        } catch (error) {
          throw explainStorageError(error, 'The import');
        }
      },
      mergedElsewhere: (marks) => {
        clock.observe(marks.latestStamp);
        db.sequence.startAbove(marks.writeMark);
      },
      peers: async () => (await changeSets()).listPeers(db),
      backupStatus: () => loadBackupStatus(db),
      reminderDays: async () => {
        const v = (await db.deviceSettings.get(REMINDER_KEY))?.value;
        return typeof v === 'number' && v >= 1 ? v : DEFAULT_REMINDER_DAYS;
      },
      setReminderDays: async (days) => {
        const v = Math.min(365, Math.max(1, Math.round(days)));
        await db.deviceSettings.put({ key: REMINDER_KEY, value: v });
        return v;
      }
    },
    syncFolder: {
      handle: () => loadFolderHandle(db),
      setHandle: (handle) => saveFolderHandle(db, handle),
      state: () => loadFolderSyncState(db),
      saveState: (state) => saveFolderSyncState(db, state),
      writeMark: () => db.sequence.latest
    },
    loadDemo: (file) => loadDemoPortfolio(db, file),
    demoPresent: () => isDemoPresent(db),
    removeDemo: () => removeDemoPortfolio(db, ctx),
    deviceName: () => loadDeviceName(db),
    setDeviceName: (name) => saveDeviceName(db, name),
    // Loaded on first use: only Settings and the review need the rates.
    reportingCurrency: async () => {
      const v = (await db.deviceSettings.get(REPORTING_CURRENCY_KEY))?.value;
      if (v === undefined) return undefined;
      try {
        return (await import('../domain/reporting-currency')).parseReportingCurrency(v);
      } catch {
        return undefined;
      }
    },
    setReportingCurrency: async (value) => {
      if (value === undefined) {
        await db.deviceSettings.delete(REPORTING_CURRENCY_KEY);
        return undefined;
      }
      const parsed = (await import('../domain/reporting-currency')).parseReportingCurrency(value);
      await db.deviceSettings.put({ key: REPORTING_CURRENCY_KEY, value: parsed });
      return parsed;
    },
    close: () => db.close()
  };
  databases.set(storage, db);
  return storage;
}
