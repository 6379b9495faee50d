import type { DBCore, DBCoreMutateRequest, Middleware } from 'dexie';
import { RECORD_TABLES } from './record-tables';
import { shelfOf, type StudyShelf } from './study-shelf';

/**
 * This device's write sequence. Every add or put of a synchronised record — typed here, imported from a
 * file, restored — is stamped with `localSeq`, so "changed since the last file sent to X" is a range of one
 * index. The value is the wall time in ms but never less than one above the last one given, so it only grows
 * even if the clock is set back; one bulk write shares one value. It is device-local: exports leave it out.
 */
export class LocalSequence {
  private last = 0;

  constructor(private readonly wallMs: () => number = () => Date.now()) {}

  /** Starts above the highest value already stored (called once the database is open). */
  startAbove(value: number): void {
    if (value > this.last) this.last = value;
  }

  next(): number {
    this.last = Math.max(Math.floor(this.wallMs()), this.last + 1);
    return this.last;
  }

  get latest(): number {
    return this.last;
  }
}

const SEQUENCED = new Set<string>(RECORD_TABLES);

/**
 * Dexie middleware that stamps `localSeq` on every add and put of a synchronised table. On a study shelf it stamps
 * the studies that have none (those written now: the shelf's writer leaves it off them, study-shelves.ts) and
 * gives the shelf the highest of its studies'.
 */
export function localSequenceMiddleware(sequence: LocalSequence): Middleware<DBCore> {
  return {
    stack: 'dbcore',
    name: 'capstanLocalSequence',
    create(down) {
      return {
        ...down,
        table(name) {
          const table = down.table(name);
          if (!SEQUENCED.has(name)) return table;
          return {
            ...table,
            mutate(req: DBCoreMutateRequest) {
              if (req.type !== 'add' && req.type !== 'put') return table.mutate(req);
              const seq = sequence.next();
              const values =
                name === 'studyShelves'
                  ? req.values.map((v: StudyShelf) => shelfOf(v.characteristicId, v.studies, seq))
                  : req.values.map((v: object) => ({ ...v, localSeq: seq }));
              return table.mutate({ ...req, values });
            }
          };
        }
      };
    }
  };
}
