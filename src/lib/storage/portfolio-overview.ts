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
import { allStudies, eachStudy, studiesOf } from './study-shelves';

/** One process as the portfolio lists it before capability figures exist for it. */
export interface ProcessOverview {
  process: Process;
  site: Site;
  characteristics: Characteristic[];
  /** Latest month with a study for any of its characteristics, or undefined when none. */
  latestPeriod: string | undefined;
  studyCount: number;
  /** Projects not yet closed (all phases count until a project is deleted). */
  projects: ImprovementProject[];
}

/** A light index of studies: what the overview needs, without each study's measured values. */
export interface StudyIndexEntry {
  id: string;
  characteristicId: string;
  period: string;
  kind: Study['data']['kind'];
}

async function liveStudyIndex(db: CapstanDatabase): Promise<StudyIndexEntry[]> {
  const out: StudyIndexEntry[] = [];
  await eachStudy(db, (s) => {
    if (isLive(s))
      out.push({ id: s.id, characteristicId: s.characteristicId, period: s.period, kind: s.data.kind });
  });
  return out;
}

/** Every live process with its site, characteristics, latest period and projects; sorted by site then name. */
export async function listProcessOverviews(db: CapstanDatabase): Promise<ProcessOverview[]> {
  const [sites, processes, characteristics, projects, studies] = await Promise.all([
    recordsInSlices(db.sites),
    recordsInSlices(db.processes),
    recordsInSlices(db.characteristics),
    recordsInSlices(db.projects),
    liveStudyIndex(db)
  ]);
  const siteById = new Map(sites.filter(isLive).map((s) => [s.id, s]));
  const charsByProcess = new Map<string, Characteristic[]>();
  for (const c of characteristics.filter(isLive)) {
    charsByProcess.set(c.processId, [...(charsByProcess.get(c.processId) ?? []), c]);
  }
  const processOfCharacteristic = new Map(characteristics.map((c) => [c.id, c.processId]));
  const latest = new Map<string, string>();
  const counts = new Map<string, number>();
  for (const s of studies) {
    const pid = processOfCharacteristic.get(s.characteristicId);
    if (!pid) continue;
    counts.set(pid, (counts.get(pid) ?? 0) + 1);
    if ((latest.get(pid) ?? '') < s.period) latest.set(pid, s.period);
  }
  const projectsByProcess = new Map<string, ImprovementProject[]>();
  for (const p of projects.filter(isLive)) {
    projectsByProcess.set(p.processId, [...(projectsByProcess.get(p.processId) ?? []), p]);
  }
  const rows: ProcessOverview[] = [];
  for (const process of processes.filter(isLive)) {
    const site = siteById.get(process.siteId);
    if (!site) continue;
    rows.push({
      process,
      site,
      characteristics: charsByProcess.get(process.id) ?? [],
      latestPeriod: latest.get(process.id),
      studyCount: counts.get(process.id) ?? 0,
      projects: projectsByProcess.get(process.id) ?? []
    });
  }
  return rows.sort(
    (a, b) => a.site.name.localeCompare(b.site.name) || a.process.name.localeCompare(b.process.name)
  );
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

/**
 * A mark that changes whenever a record the portfolio is ranked from is written, in this tab or another: the
 * latest device-local sequence number and the row count of each table (a delete is a tombstone, so a put). Read
 * through indexes only — nothing is cloned — so a page can watch it and let a worker read the records
 * themselves (storage/portfolio-reader.ts).
 */
export async function portfolioChangeMark(
  db: CapstanDatabase
): Promise<{ mark: string; storedSites: number; storedProcesses: number }> {
  const parts = await Promise.all(
    [db.sites, db.processes, db.characteristics, db.studyShelves, db.projects].map(async (table) => {
      const t = table as unknown as typeof db.sites;
      const [last, count] = await Promise.all([t.orderBy('localSeq').lastKey(), t.count()]);
      return { last: String(last ?? 0), count };
    })
  );
  return {
    mark: parts.map((p) => `${p.last}/${p.count}`).join(' '),
    // Stored rows, deleted ones included: zero means there is certainly nothing to rank.
    storedSites: parts[0]!.count,
    storedProcesses: parts[1]!.count
  };
}
