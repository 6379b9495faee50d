import type { Characteristic } from '../domain/characteristic';
import type { Process } from '../domain/process';
import { isLive } from '../domain/record-meta';
import type { Study } from '../domain/study';
import type { CapstanDatabase } from './database';
import { studiesUnder } from './study-shelves';

/** One characteristic's state for one month at one site. */
export interface LogStatusRow {
  process: Process;
  characteristic: Characteristic;
  /** The live study for the month, when one has been logged. */
  study: Study | undefined;
}

export interface MonthlyLogStatus {
  period: string;
  rows: LogStatusRow[];
  open: number;
}

/** Every characteristic of a site with its study for `period`; not yet logged first, then by process and name. */
export async function loadMonthlyLogStatus(
  db: CapstanDatabase,
  siteId: string,
  period: string
): Promise<MonthlyLogStatus> {
  const processes = (await db.processes.where('siteId').equals(siteId).toArray()).filter(isLive);
  const characteristics = (
    await db.characteristics
      .where('processId')
      .anyOf(processes.map((p) => p.id))
      .toArray()
  ).filter(isLive);
  const studies = (
    await studiesUnder(
      db,
      characteristics.map((c) => c.id)
    )
  ).filter((s) => s.period === period && isLive(s));
  const studyByCharacteristic = new Map(studies.map((s) => [s.characteristicId, s]));
  const processById = new Map(processes.map((p) => [p.id, p]));
  const rows: LogStatusRow[] = characteristics.map((characteristic) => ({
    process: processById.get(characteristic.processId) as Process,
    characteristic,
    study: studyByCharacteristic.get(characteristic.id)
  }));
  rows.sort(
    (a, b) =>
      Number(a.study !== undefined) - Number(b.study !== undefined) ||
      a.process.name.localeCompare(b.process.name) ||
      a.characteristic.name.localeCompare(b.characteristic.name)
  );
  return { period, rows, open: rows.filter((r) => !r.study).length };
}
