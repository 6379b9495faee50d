import type { Study } from '../../src/lib/domain/study';

/** A one-month summary study as a shelf holds it (storage/study-shelf.ts), with a write sequence when given. */
export function shelvedStudy(id: string, characteristicId: string, period: string, localSeq?: number): Study {
  return {
    id,
    characteristicId,
    period,
    createdAt: '',
    updatedAt: '',
    rev: 1,
    deviceId: 'd',
    data: { kind: 'summary', n: 30, mean: 1, sd: 0.1 },
    enteredBy: '',
    ...(localSeq !== undefined ? { localSeq } : {})
  } as Study;
}

/** The write sequence a stored study carries (device-local, not part of the record's type). */
export function seqOf(study: Study | undefined): number | undefined {
  return (study as (Study & { localSeq?: number }) | undefined)?.localSeq;
}
