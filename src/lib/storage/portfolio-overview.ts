import { onePerMonth } from '../domain/study-month';
import type { Characteristic } from '../domain/characteristic';
import type { ImprovementProject } from '../domain/improvement-project';
import type { Process } from '../domain/process';
import { isLive, type RecordMeta } from '../domain/record-meta';
import type { Table } from 'dexie';
import type { Site } from '../domain/site';
import type { Study } from '../domain/study';
import type { CapstanDatabase } from './database';
import { recordsInSlices } from './records-in-slices';
import { allStudies, eachStudy, shelvesOf, studiesOf } from './study-shelves';

/**
 * One process as the process list shows it: its site, characteristics and open projects. No study is read for it:
 * at 20 000 processes × 36 months that was every study of the company, deserialised on the page's thread to find
 * each process's latest month; the list asks for the months of the processes it shows (latestLiveMonths).
 */
export interface ProcessOverview {
  process: Process;
  site: Site;
  characteristics: Characteristic[];
  /** Projects not yet closed (all phases count until a project is deleted). */
  projects: ImprovementProject[];
}

/**
 * Names in the order localeCompare gives them (the device's language), through one collator: not one looked up
 * for each of some 300 000 comparisons at 20 000 processes.
 */
const byName = new Intl.Collator().compare;

/** Every live process with its site, characteristics and projects; sorted by site then name. */
export async function listProcessOverviews(db: CapstanDatabase): Promise<ProcessOverview[]> {
  const [sites, processes, characteristics, projects] = await Promise.all([
    recordsInSlices(db.sites),
    recordsInSlices(db.processes),
    recordsInSlices(db.characteristics),
    recordsInSlices(db.projects)
  ]);
  const siteById = new Map(sites.filter(isLive).map((s) => [s.id, s]));
  const charsByProcess = new Map<string, Characteristic[]>();
  for (const c of characteristics) {
    if (!isLive(c)) continue;
    const list = charsByProcess.get(c.processId);
    if (list) list.push(c);
    else charsByProcess.set(c.processId, [c]);
  }
  const projectsByProcess = new Map<string, ImprovementProject[]>();
  for (const p of projects) {
    if (!isLive(p)) continue;
    const list = projectsByProcess.get(p.processId);
    if (list) list.push(p);
    else projectsByProcess.set(p.processId, [p]);
  }
  const rows: ProcessOverview[] = [];
  for (const process of processes) {
    if (!isLive(process)) continue;
    const site = siteById.get(process.siteId);
    if (!site) continue;
    rows.push({
      process,
      site,
      characteristics: charsByProcess.get(process.id) ?? [],
      projects: projectsByProcess.get(process.id) ?? []
    });
  }
  return rows.sort((a, b) => byName(a.site.name, b.site.name) || byName(a.process.name, b.process.name));
}

/** The latest month with a live study of each of these characteristics (those with none are left out). */
export async function latestLiveMonths(
  db: CapstanDatabase,
  characteristicIds: readonly string[]
): Promise<Map<string, string>> {
  const latest = new Map<string, string>();
  for (const shelf of await shelvesOf(db, characteristicIds)) {
    // A shelf holds its studies in month order: the last live one is the latest.
    for (let i = shelf.studies.length - 1; i >= 0; i -= 1)
      if (isLive(shelf.studies[i]!)) {
        latest.set(shelf.characteristicId, shelf.studies[i]!.period);
        break;
      }
  }
  return latest;
}

/** One process with everything beneath it, for the process page. */
export interface ProcessDetail {
  process: Process;
  site: Site;
  characteristics: { characteristic: Characteristic; studies: Study[] }[];
  projects: ImprovementProject[];
}

export async function loadProcessDetail(
  db: CapstanDatabase,
  processId: string
): Promise<ProcessDetail | undefined> {
  const process = await db.processes.get(processId);
  if (!process || !isLive(process)) return undefined;
  const site = await db.sites.get(process.siteId);
  if (!site || !isLive(site)) return undefined;
  const characteristics = (await db.characteristics.where('processId').equals(processId).toArray()).filter(
    isLive
  );
  const withStudies = await Promise.all(
    characteristics.map(async (characteristic) => ({
      characteristic,
      studies: onePerMonth(await studiesOf(db, characteristic.id))
    }))
  );
  const projects = (await db.projects.where('processId').equals(processId).toArray()).filter(isLive);
  return { process, site, characteristics: withStudies, projects };
}

/** Record counts per table, live and tombstoned, and the devices that wrote them. */
export interface DatabaseSummary {
  tables: { name: string; live: number; tombstones: number }[];
  devices: { deviceId: string; records: number; lastWrite: string }[];
}

export async function summariseDatabase(db: CapstanDatabase): Promise<DatabaseSummary> {
  const tables: DatabaseSummary['tables'] = [];
  const devices = new Map<string, { records: number; lastWrite: string }>();
  const eachOf =
    (table: Table<RecordMeta, string>) =>
    (visit: (r: RecordMeta) => void): Promise<void> =>
      table.each(visit);
  const named: [string, (visit: (r: RecordMeta) => void) => Promise<void>][] = [
    ['Sites', eachOf(db.sites)],
    ['Processes', eachOf(db.processes)],
    ['Characteristics', eachOf(db.characteristics)],
    ['Studies', (visit) => eachStudy(db, visit)],
    ['Improvement projects', eachOf(db.projects)],
    ['Context targets (edited)', eachOf(db.contextProfiles)]
  ];
  for (const [name, each] of named) {
    let live = 0;
    let tombstones = 0;
    await each((r) => {
      if (isLive(r)) live += 1;
      else tombstones += 1;
      const d = devices.get(r.deviceId) ?? { records: 0, lastWrite: '' };
      d.records += 1;
      if (r.updatedAt > d.lastWrite) d.lastWrite = r.updatedAt;
      devices.set(r.deviceId, d);
    });
    tables.push({ name, live, tombstones });
  }
  return {
    tables,
    devices: [...devices.entries()]
      .map(([deviceId, d]) => ({ deviceId, ...d }))
      .sort((a, b) => b.lastWrite.localeCompare(a.lastWrite))
  };
}

/** Every live record the portfolio ranking needs, read in one go (studies with their values). */
export async function loadPortfolioRecords(db: CapstanDatabase) {
  const [sites, processes, characteristics, studies, projects] = await Promise.all([
    db.sites.toArray(),
    db.processes.toArray(),
    db.characteristics.toArray(),
    allStudies(db),
    db.projects.toArray()
  ]);
  return {
    sites: sites.filter(isLive),
    processes: processes.filter(isLive),
    characteristics: characteristics.filter(isLive),
    studies: onePerMonth(studies),
    projects: projects.filter(isLive)
  };
}

/** Each table's latest device-local sequence number and row count, read through indexes only. */
function tableMarks(tables: readonly object[]): Promise<{ last: string; count: number }[]> {
  return Promise.all(
    tables.map(async (table) => {
      const t = table as Table<RecordMeta, string>;
      const [last, count] = await Promise.all([t.orderBy('localSeq').lastKey(), t.count()]);
      return { last: String(last ?? 0), count };
    })
  );
}

/**
 * A mark that changes whenever a record summariseDatabase counts is written, in this tab or another (as
 * portfolioChangeMark, with the context targets too): a page watches it and lets a worker count the records
 * (portfolio-reader.ts, summariseRecords).
 */
export async function recordsChangeMark(db: CapstanDatabase): Promise<string> {
  const parts = await tableMarks([
    db.sites,
    db.processes,
    db.characteristics,
    db.studyShelves,
    db.projects,
    db.contextProfiles
  ]);
  return parts.map((p) => `${p.last}/${p.count}`).join(' ');
}

/**
 * A mark that changes whenever a record the portfolio is ranked from is written, in this tab or another: the
 * latest device-local sequence number and the row count of each table (a delete is a tombstone, so a put). Read
 * through indexes only — nothing is cloned — so a page can watch it and let a worker read the records
 * themselves (storage/portfolio-reader.ts).
 */
export async function portfolioChangeMark(
  db: CapstanDatabase
): Promise<{ mark: string; storedSites: number; storedProcesses: number }> {
  const parts = await tableMarks([db.sites, db.processes, db.characteristics, db.studyShelves, db.projects]);
  return {
    mark: parts.map((p) => `${p.last}/${p.count}`).join(' '),
    // Stored rows, deleted ones included: zero means there is certainly nothing to rank.
    storedSites: parts[0]!.count,
    storedProcesses: parts[1]!.count
  };
}
