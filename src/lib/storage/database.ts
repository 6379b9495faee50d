import { Dexie, type DexieOptions, type EntityTable } from 'dexie';
import type { Characteristic } from '../domain/characteristic';
import type { ImprovementProject } from '../domain/improvement-project';
import type { Process } from '../domain/process';
import type { Site } from '../domain/site';
import type { Study } from '../domain/study';
import { declareSchemaVersions } from './schema-versions';

/** Settings that belong to this device only and never travel in an export. */
export interface DeviceSetting {
  key: string;
  value: unknown;
}

export const DEFAULT_DATABASE_NAME = 'capstan';

/** The one typed database class. Only the storage layer sees it; the app works through repositories. */
export class CapstanDatabase extends Dexie {
  sites!: EntityTable<Site, 'id'>;
  processes!: EntityTable<Process, 'id'>;
  characteristics!: EntityTable<Characteristic, 'id'>;
  studies!: EntityTable<Study, 'id'>;
  projects!: EntityTable<ImprovementProject, 'id'>;
  deviceSettings!: EntityTable<DeviceSetting, 'key'>;

  constructor(name: string = DEFAULT_DATABASE_NAME, options?: DexieOptions) {
    super(name, options);
    declareSchemaVersions(this);
  }
}

/** Names of the tables that hold synchronised records (not device settings). */
export const RECORD_TABLES = ['sites', 'processes', 'characteristics', 'studies', 'projects'] as const;
export type RecordTableName = (typeof RECORD_TABLES)[number];
