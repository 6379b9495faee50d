import type { Characteristic } from '../domain/characteristic';
import { combineStudyData } from '../domain/combine-study-data';
import type { Process } from '../domain/process';
import { isLive, stampDeleted, stampUpdate, type Editable, type WriteContext } from '../domain/record-meta';
import type { Study } from '../domain/study';
import { characteristicOfMonthKey } from '../domain/study-month';
import type { CapstanDatabase, MonthClash } from './database';
import { putStudies, studiesOf } from './study-shelves';

/** A pending month with two or more live studies (from before schema v7), with what a person needs to choose. */
export interface PendingMonth {
  key: string;
  period: string;
  characteristic?: Characteristic;
  process?: Process;
  studies: Study[];
}

export type MonthSettlement = { keep: string } | { combine: true };

/**
 * Months that still hold two live studies from before one study per month was enforced, and their settling:
 * keep one (the others are deleted, as revisions that travel) or combine them exactly into the one with the
 * lowest id (so two devices that combine the same pair agree). A month already settled elsewhere (a file
 * brought the deletion) drops out by itself.
 */
/** The live studies among a clash's, found on the shelf of the characteristic its key names. */
async function liveStudiesOf(d: CapstanDatabase, row: MonthClash): Promise<Study[]> {
  const ids = new Set(row.studyIds);
  return (await studiesOf(d, characteristicOfMonthKey(row.key))).filter((s) => ids.has(s.id) && isLive(s));
}

export class MonthClashRepository {
  constructor(
    private readonly db: CapstanDatabase,
    private readonly ctx: WriteContext
  ) {}

  async list(): Promise<PendingMonth[]> {
    const d = this.db;
    // Read-only (it runs inside live queries): rows already settled elsewhere are skipped, and removed by `settle`.
    return d.transaction('r', [d.monthClashes, d.studyShelves, d.characteristics, d.processes], async () => {
      const out: PendingMonth[] = [];
      for (const row of await d.monthClashes.toArray()) {
        const studies = await liveStudiesOf(d, row);
        if (studies.length < 2) continue;
        const characteristic = await d.characteristics.get(studies[0]!.characteristicId);
        const process = characteristic ? await d.processes.get(characteristic.processId) : undefined;
        out.push({
          key: row.key,
          period: studies[0]!.period,
          studies: studies.sort((a, b) => (a.id < b.id ? -1 : 1)),
          ...(characteristic ? { characteristic } : {}),
          ...(process ? { process } : {})
        });
      }
      return out;
    });
  }

  async settle(key: string, choice: MonthSettlement): Promise<void> {
    const d = this.db;
    await d.transaction('rw', [d.monthClashes, d.studyShelves, d.studyRevisions], async () => {
      const row = await d.monthClashes.get(key);
      if (!row) return;
      const studies = (await liveStudiesOf(d, row)).sort((a, b) => (a.id < b.id ? -1 : 1));
      if (studies.length >= 2) {
        const keeper = 'keep' in choice ? studies.find((s) => s.id === choice.keep) : studies[0];
        if (!keeper)
          throw new Error(`Study ${'keep' in choice ? choice.keep : ''} is not one of this month's studies`);
        const others = studies.filter((s) => s !== keeper);
        const writes: Study[] = others.map((s) => stampDeleted(s, this.ctx));
        if ('combine' in choice) {
          let data = keeper.data;
          for (const s of others) data = combineStudyData(data, s.data);
          const { characteristicId, period, enteredBy, note } = keeper;
          const fields: Editable<Study> = {
            characteristicId,
            period,
            enteredBy,
            data,
            ...(note ? { note } : {})
          };
          writes.push(stampUpdate(keeper, fields, this.ctx));
          await d.studyRevisions.add({
            id: this.ctx.newId(),
            studyId: keeper.id,
            savedAt: this.ctx.now().toISOString(),
            reason: 'combined',
            study: keeper
          });
        }
        await putStudies(d, writes);
      }
      await d.monthClashes.delete(key);
    });
  }
}
