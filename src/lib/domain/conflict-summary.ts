import type { ConflictChoice, MergeConflict } from './change-set-merge';
import { countOfKind, KIND_LABEL, type RecordKind } from './record-kinds';
import { compareEdits, editTimeOf, newerReason } from './record-merge';
import type { RecordMeta } from './record-meta';
import type { Study } from './study';
import { dataRows } from './study-description';

/**
 * A conflict as a person reads it: what the record is (named through its parents, never by id alone), what each
 * side holds, field by field in words, when and by whom each side was last edited, what each choice does, and
 * which side "newer edit wins" would keep and why — stated from the same edit times the rows show.
 */
export interface ConflictSummary {
  title: string;
  question: string;
  rows: { label: string; here: string; there: string }[];
  choices: { value: ConflictChoice; label: string }[];
  /** What the rule "newer edit wins" keeps here, in words. */
  newer: string;
}

/** Finds a record by id on either side (this device's snapshot first, then the file). */
export type RecordLookup = (id: string) => RecordMeta | undefined;

const text = (v: unknown) => (typeof v === 'string' ? v : '');

/** "Bore depth — Gravity casting, Harlow Bend works": a characteristic, process or site named with its parents. */
export function namePath(kind: RecordKind, record: RecordMeta | undefined, lookup: RecordLookup): string {
  if (!record) return 'a record not on this device';
  const r = record as unknown as Record<string, unknown>;
  const own = text(r.name) || text(r.title) || text(r.label) || record.id;
  const parentId =
    kind === 'characteristics'
      ? text(r.processId)
      : kind === 'processes' || kind === 'projects'
        ? text(r.processId) || text(r.siteId)
        : '';
  if (kind === 'processes') {
    const site = lookup(text(r.siteId)) as unknown as Record<string, unknown> | undefined;
    return site ? `${own} — ${text(site.name)}` : own;
  }
  if (kind === 'characteristics' || kind === 'projects') {
    const process = lookup(parentId);
    return process ? `${own} — ${namePath('processes', process, lookup)}` : own;
  }
  return own;
}

function studyTitle(study: Study, lookup: RecordLookup): string {
  const characteristic = lookup(study.characteristicId);
  return `${study.period}, ${namePath('characteristics', characteristic, lookup)}`;
}

function fieldText(value: unknown): string {
  if (value === undefined || value === null || value === '') return '—';
  if (typeof value === 'object') {
    const t = JSON.stringify(value);
    return t.length > 140 ? `${t.slice(0, 140)}…` : t;
  }
  return String(value);
}

function stateText(r: RecordMeta | undefined): string {
  if (!r) return 'not in the file';
  return r.deletedAt ? `deleted ${editTimeOf(r).slice(0, 16).replace('T', ' ')} UTC` : 'kept';
}

function editRows(
  here: RecordMeta | undefined,
  there: RecordMeta | undefined,
  deviceName: (id: string) => string
) {
  const when = (r: RecordMeta | undefined) =>
    r ? `${editTimeOf(r).slice(0, 16).replace('T', ' ')} UTC` : '—';
  const who = (r: RecordMeta | undefined) => (r ? deviceName(r.deviceId) : '—');
  return [
    { label: 'last edit', here: when(here), there: when(there) },
    { label: 'edited on', here: who(here), there: who(there) }
  ];
}

function countsText(counts: Partial<Record<RecordKind, number>> | undefined): string {
  const parts = Object.entries(counts ?? {})
    .filter(([, n]) => (n ?? 0) > 0)
    .map(([k, n]) => countOfKind(k as RecordKind, n ?? 0));
  return parts.length ? parts.join(', ') : 'none';
}

export { dataRows } from './study-description';

export function summariseConflict(
  c: MergeConflict,
  lookup: RecordLookup,
  deviceName: (id: string) => string = (id) => id
): ConflictSummary {
  const here = c.local;
  const there = c.incoming;
  if (c.type === 'same-month') {
    const a = here as Study;
    const b = there as Study;
    const rowsA = dataRows(a.data);
    const rowsB = dataRows(b.data);
    const labels = [...new Set([...rowsA.map((r) => r[0]), ...rowsB.map((r) => r[0])])];
    const order = compareEdits(a, b) || (a.id < b.id ? 1 : -1);
    return {
      title: `Study of ${studyTitle(b, lookup)}`,
      question:
        c.nature === 'emptied-month'
          ? "Each device kept a different study of this month and deleted the other's: merging would leave the month with none."
          : 'This month was logged on both devices: a characteristic has one study per month.' +
            (c.revivable
              ? ` ${c.revivable === b.id ? "The file's" : "This device's"} study was deleted on this device and corrected in the file: this choice counts only if that correction is taken (its own question); keeping the deletion keeps the other study.`
              : ''),
      rows: [
        ...labels.map((label) => ({
          label,
          here: rowsA.find((r) => r[0] === label)?.[1] ?? '—',
          there: rowsB.find((r) => r[0] === label)?.[1] ?? '—'
        })),
        { label: 'entered by', here: a.enteredBy || '—', there: b.enteredBy || '—' },
        { label: 'note', here: a.note || '—', there: b.note || '—' },
        ...editRows(a, b, deviceName)
      ],
      choices: [
        { value: 'local', label: "Keep this device's study" },
        { value: 'incoming', label: "Take the file's study" },
        ...(c.canCombine
          ? [{ value: 'combine' as const, label: 'Combine both (pooled exactly, as separate samples)' }]
          : [])
      ],
      newer: `Newer edit wins keeps ${order > 0 ? "this device's" : "the file's"} study (${newerReason(order > 0 ? a : b, order > 0 ? b : a)}).`
    };
  }
  const subject = (here ?? there)!;
  const name =
    c.kind === 'studies'
      ? `Study of ${studyTitle(subject as Study, lookup)}`
      : `${capital(KIND_LABEL[c.kind])} “${namePath(c.kind, subject, lookup)}”`;
  if (c.type === 'family') {
    const deletedHere = c.nature === 'deleted-here';
    return {
      title: name,
      question: deletedHere
        ? 'Deleted on this device, but the file edits it or brings records under it.'
        : 'Deleted in the file, but this device edited it or holds records under it that the deletion does not cover.',
      rows: [
        { label: 'state', here: stateText(here), there: stateText(there) },
        { label: 'records under it at stake', here: countsText(c.atStake), there: countsText(c.atStake) },
        {
          label: 'records deleted with it',
          here: countsText(c.deletedWith),
          there: countsText(c.deletedWith)
        },
        ...editRows(here, there, deviceName)
      ],
      choices: [
        {
          value: 'local',
          label: deletedHere
            ? 'Keep it deleted, with everything under it'
            : 'Keep it, with the records under it'
        },
        {
          value: 'incoming',
          label: deletedHere
            ? 'Bring it back, with the records under it'
            : 'Delete it, with everything under it'
        }
      ],
      newer:
        'Newer edit wins keeps it when any edit at stake (the record or anything under it) is later than the deletion.'
    };
  }
  const fields = (c.fields ?? []).filter((f) => f !== 'deleted');
  const rows: ConflictSummary['rows'] = [];
  if ((c.fields ?? []).includes('deleted'))
    rows.push({ label: 'state', here: stateText(here), there: stateText(there) });
  if (c.kind === 'studies') {
    const a = here ? dataRows((here as Study).data) : [];
    const b = there ? dataRows((there as Study).data) : [];
    for (const [label, value] of a)
      rows.push({ label, here: value, there: b.find((r) => r[0] === label)?.[1] ?? '—' });
  }
  for (const f of fields) {
    if (c.kind === 'studies' && f === 'data') continue;
    rows.push({
      label: f,
      here: fieldText((here as unknown as Record<string, unknown>)?.[f]),
      there: fieldText((there as unknown as Record<string, unknown>)?.[f])
    });
  }
  rows.push(...editRows(here, there, deviceName));
  const newerHere = here && there ? compareEdits(here, there) >= 0 : false;
  return {
    title: name,
    question:
      c.nature === 'diverged'
        ? 'The two devices settled an earlier conflict differently.'
        : c.nature === 'both-edited'
          ? 'Edited on both devices since they last exchanged files.'
          : c.nature === 'deleted-here'
            ? 'Deleted on this device, edited in the file.'
            : 'Edited on this device, deleted in the file.',
    rows,
    choices: [
      { value: 'local', label: "Keep this device's version" },
      { value: 'incoming', label: "Take the file's version" }
    ],
    newer:
      here && there
        ? `Newer edit wins keeps ${newerHere ? "this device's" : "the file's"} version (${newerReason(newerHere ? here : there, newerHere ? there : here)}).`
        : ''
  };
}

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
