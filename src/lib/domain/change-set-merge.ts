import { sortById } from './id-order';
import { combineStudyData } from './combine-study-data';
import { laterStamp } from './hybrid-clock';
import { pauseEvery, runToEnd, type Steps } from './work-steps';
import {
  KIND_LABEL,
  PARENT_OF,
  parentIdOf,
  RECORD_KINDS,
  type RecordKind,
  type RecordsByKind
} from './record-kinds';
import type { IndexedRecord, RecordIndex } from './record-index';
import {
  compareEdits,
  differingFields,
  mergeRecord,
  settleConflict,
  type ConflictNature,
  type ConflictRule,
  type MergeDecision,
  type MergeKind
} from './record-merge';
import {
  clockOf,
  editableOf,
  isLive,
  stampDeleted,
  stampRestored,
  stampUpdate,
  travelling,
  type Editable,
  type RecordMeta,
  type WriteContext
} from './record-meta';
import type { Study } from './study';
import { StudyMonthSet, studyMonthKey } from './study-month';

/**
 * Merging a change set into the records of one side — the one merge of Capstan: the app's import (through the
 * database, storage/change-set-store.ts), the command line's `merge`, and the oracle of the property tests.
 * `planMerge` works out, without writing, what every record would become and which conflicts a person must
 * settle; `settleMerge` turns the plan and the person's choices into the records to write.
 *
 * Beyond the merge of each record by its version vector (record-merge.ts), a change set is merged as a whole
 * under three rules (README, "How files merge"):
 * 1. **One live study per characteristic and month.** A live study arriving for a month that already has a
 *    different live study is a conflict (`same-month`): keep this side's, take the file's, or combine both
 *    exactly (the study with the lower id keeps the pooled data, so two devices that combine agree). A month
 *    that has a live study on both sides but none after merging (each side deleted the other's) is the same
 *    question (`emptied-month`), and the study chosen comes back.
 * 2. **No record outlives its parent.** A parent deleted on one side while the other side edited it or has live
 *    records under it is one conflict for the whole family (`family`), counting the records at stake. Whatever
 *    is chosen, the family ends consistent: a parent that stays live brings back the records deleted with it
 *    (same deletion time), a parent that ends deleted takes every live record under it along.
 * 3. **Settling writes.** Where a choice needs a record to change beyond picking a version (a study set aside,
 *    a parent brought back), this side writes it as a new revision, so the outcome travels and supersedes both.
 */
export type ConflictChoice = 'local' | 'incoming' | 'combine';

export type FamilyNature = 'deleted-here' | 'deleted-there';

export interface MergeConflict {
  /** Key of the choice: the record id, or `month:<characteristic>|<period>` for a same-month conflict. */
  key: string;
  type: 'record' | 'family' | 'same-month';
  kind: RecordKind;
  /** For a same-month conflict: two live studies (`same-month`), or none left by the merge (`emptied-month`). */
  nature: ConflictNature | 'same-month' | 'emptied-month';
  /** This side's version (for same-month: this side's study of the month). */
  local?: RecordMeta;
  /** The file's version (for same-month: the file's study of the month); absent when the file does not hold it. */
  incoming?: RecordMeta;
  /** Top-level fields that differ (record conflicts). */
  fields?: string[];
  /** Family: live records under the parent that deleting it removes, by kind. */
  atStake?: Partial<Record<RecordKind, number>>;
  /** Family: records deleted together with the parent that keeping it brings back, by kind. */
  deletedWith?: Partial<Record<RecordKind, number>>;
  /** Same-month: whether the two studies can be pooled exactly (same data family, same opportunities). */
  canCombine?: boolean;
  /**
   * Same-month: the study of the two that is deleted on this device and edited in the file. It takes part only if
   * its own question (a record conflict) takes the edit; keeping the deletion leaves the month with the other.
   */
  revivable?: string;
  /** The per-record decision behind a record or family conflict, when the vectors gave one. */
  decision?: MergeDecision<RecordMeta>;
  /** Family: delete-vs-edit conflicts of records inside it, settled by the family's choice. */
  absorbed?: { kind: RecordKind; decision: MergeDecision<RecordMeta> }[];
}

const isDeleteVsEdit = (c: Pick<MergeConflict, 'nature'>) =>
  c.nature === 'deleted-here' || c.nature === 'deleted-there';

/** The side of a delete-vs-edit decision that holds the live version. */
function liveSideOf(d: MergeDecision<RecordMeta>): 'local' | 'incoming' {
  return d.local && isLive(d.local) ? 'local' : 'incoming';
}

export interface MergePlan {
  /** Every per-record decision that writes or asks (unchanged records are only counted). */
  decisions: { kind: RecordKind; decision: MergeDecision<RecordMeta> }[];
  counts: Record<MergeKind, number>;
  countsByKind: Record<RecordKind, Record<MergeKind, number>>;
  conflicts: MergeConflict[];
  /** Things worth knowing that do not stop the merge (records whose parent has not arrived yet). */
  warnings: string[];
  /** Latest clock stamp in the change set, for this device's clock. */
  latestStamp?: string;
  /** The file's version of each record it holds, by id (for settling and for the consistency pass). */
  incoming: Map<string, IndexedRecord>;
}

export interface MergeChoices {
  /** One rule for every conflict not picked one by one. */
  rule?: ConflictRule;
  perConflict?: Record<string, ConflictChoice>;
}

/** The merge cannot go ahead at all (nothing is written). */
export class MergeRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MergeRefused';
  }
}

/** A count per merge outcome, all zero. */
export const zeroCounts = (): Record<MergeKind, number> => ({
  new: 0,
  updated: 0,
  deleted: 0,
  unchanged: 0,
  conflict: 0
});

const PARENT_KINDS: RecordKind[] = ['sites', 'processes', 'characteristics'];

function tally(records: readonly IndexedRecord[]): Partial<Record<RecordKind, number>> {
  const out: Partial<Record<RecordKind, number>> = {};
  for (const r of records) out[r.kind] = (out[r.kind] ?? 0) + 1;
  return out;
}

/** Whether two studies of one month can be pooled exactly into one. */
export function canCombineStudies(a: Study, b: Study): boolean {
  try {
    combineStudyData(a.data, b.data);
    return true;
  } catch {
    return false;
  }
}

export function monthConflictKey(study: Pick<Study, 'characteristicId' | 'period'>): string {
  return `month:${studyMonthKey(study)}`;
}

/** Every ancestor id of a record in `index`, nearest first. */
function ancestorsOf(index: RecordIndex, kind: RecordKind, record: RecordMeta): string[] {
  const out: string[] = [];
  let k: RecordKind = kind;
  let r: RecordMeta | undefined = record;
  while (r && PARENT_OF[k]) {
    const parentId = parentIdOf(k, r);
    if (parentId === undefined) break;
    out.push(parentId);
    k = PARENT_OF[k]!.kind;
    r = index.record(parentId);
  }
  return out;
}

/** Works out, without writing anything, what merging `incoming` into `local` does (see the module note). */
export function planMerge(local: RecordIndex, incoming: RecordsByKind): MergePlan {
  return runToEnd(planMergeSteps(local, incoming));
}

/** planMerge in steps (work-steps.ts): a page runs it between its other tasks, a file of any size at once. */
export function* planMergeSteps(local: RecordIndex, incoming: RecordsByKind): Steps<MergePlan> {
  const pause = pauseEvery();
  const plan: MergePlan = {
    decisions: [],
    counts: zeroCounts(),
    countsByKind: Object.fromEntries(RECORD_KINDS.map((k) => [k, zeroCounts()])) as MergePlan['countsByKind'],
    conflicts: [],
    warnings: [],
    incoming: new Map()
  };
  const planned = local.copy();
  const recordConflicts = new Map<string, MergeConflict>();
  for (const kind of RECORD_KINDS) {
    for (const record of incoming[kind] as RecordMeta[]) {
      if (pause()) yield;
      const here = local.get(record.id);
      if (here && here.kind !== kind) {
        throw new MergeRefused(
          `${KIND_LABEL[kind]} ${record.id} in the file is a ${KIND_LABEL[here.kind]} on this device: the file is not consistent with this data`
        );
      }
      plan.incoming.set(record.id, { kind, record });
      const decision = mergeRecord(here?.record, record);
      plan.counts[decision.kind] += 1;
      plan.countsByKind[kind][decision.kind] += 1;
      plan.latestStamp = laterStamp(plan.latestStamp, clockOf(record));
      if (decision.kind === 'unchanged') continue;
      plan.decisions.push({ kind, decision });
      if (decision.kind === 'conflict') {
        const c: MergeConflict = {
          key: record.id,
          type: 'record',
          kind,
          nature: decision.nature!,
          ...(decision.local ? { local: decision.local } : {}),
          incoming: decision.incoming,
          fields: decision.fields ?? [],
          decision
        };
        recordConflicts.set(record.id, c);
      } else if (decision.write) {
        planned.set(kind, decision.write);
      }
    }
  }

  // Families: parents deleted on one side whose edit, or records under them, live on the other. Top-down,
  // and only the topmost such parent of a family is asked about; the delete-vs-edit conflicts of records
  // inside it follow its choice.
  const candidates = new Set<string>();
  for (const { kind, record } of plan.incoming.values()) {
    if (pause()) yield;
    if (PARENT_KINDS.includes(kind)) candidates.add(record.id);
    const parent = parentIdOf(kind, record);
    if (parent !== undefined) candidates.add(parent);
  }
  const families = new Map<string, MergeConflict>();
  const inFamily = (kind: RecordKind, r: RecordMeta) =>
    ancestorsOf(planned, kind, r).some((a) => families.has(a));
  for (const parentKind of PARENT_KINDS) {
    for (const id of candidates) {
      if (pause()) yield;
      const p = planned.get(id);
      if (!p || p.kind !== parentKind || inFamily(parentKind, p.record)) continue;
      const rc = recordConflicts.get(id);
      // A live parent without a delete-vs-edit conflict of its own is no family whatever lies under it: asked
      // first, so that its descendants (a site's run to tens of thousands) are not gathered for nothing.
      if (!(rc && isDeleteVsEdit(rc)) && isLive(p.record)) continue;
      const descendants = planned.descendantsOf(parentKind, id);
      const absorbed = descendants.flatMap((d) => {
        const c = recordConflicts.get(d.record.id);
        return c && isDeleteVsEdit(c) ? [c] : [];
      });
      const stake = descendants.filter(
        (d) => isLive(d.record) || absorbed.some((c) => c.key === d.record.id)
      );
      if (!(rc && isDeleteVsEdit(rc)) && stake.length === 0) continue;
      const here = local.record(id);
      const there = plan.incoming.get(id)?.record;
      const nature: FamilyNature =
        rc && isDeleteVsEdit(rc)
          ? (rc.nature as FamilyNature)
          : here && isLive(here)
            ? 'deleted-there'
            : 'deleted-here';
      const tombstone = nature === 'deleted-there' ? there : here;
      const deletedWith = descendants.filter(
        (d) =>
          !stake.includes(d) &&
          !isLive(d.record) &&
          tombstone?.deletedAt !== undefined &&
          d.record.deletedAt === tombstone.deletedAt
      );
      families.set(id, {
        key: id,
        type: 'family',
        kind: parentKind,
        nature,
        ...(here ? { local: here } : {}),
        ...(there ? { incoming: there } : {}),
        fields: rc?.fields ?? ['deleted'],
        atStake: tally(stake),
        deletedWith: tally(deletedWith),
        absorbed: absorbed.map((c) => ({ kind: c.kind, decision: c.decision! })),
        ...(rc?.decision ? { decision: rc.decision } : {})
      });
      recordConflicts.delete(id);
      for (const c of absorbed) recordConflicts.delete(c.key);
    }
  }

  // One live study per characteristic and month — counting the studies that settling may bring back: those
  // deleted together with a parent (same deletion time) that is live, or whose family may be kept. Where such
  // a month meanwhile got another study (logged on a device that did not know of the deletion), the two are a
  // same-month conflict too, settled once the family's choice is known.
  const restorable = new Set<string>();
  for (const id of candidates) {
    if (pause()) yield;
    const p = planned.get(id);
    if (!p || !(isLive(p.record) || families.has(id))) continue;
    const instants = new Set(
      [local.record(id)?.deletedAt, plan.incoming.get(id)?.record.deletedAt].filter(
        (x): x is string => x !== undefined
      )
    );
    if (instants.size === 0) continue;
    for (const d of planned.descendantsOf(p.kind, id)) {
      if (d.kind === 'studies' && !isLive(d.record) && instants.has(d.record.deletedAt!))
        restorable.add(d.record.id);
    }
  }
  // Studies whose own delete-vs-edit conflict may bring them back (the edit chosen): `planned` holds this
  // side's deleted version until the choice is made, so they count as live for the month's question too.
  const mayRevive = new Set<string>();
  for (const c of recordConflicts.values())
    if (c.kind === 'studies' && c.incoming && (isLive(c.incoming) || (c.local && isLive(c.local))))
      mayRevive.add(c.key);
  const months: MergeConflict[] = [];
  const seenMonths = new StudyMonthSet();
  const monthsToCheck: Study[] = [
    ...incoming.studies,
    ...[...restorable].map((id) => planned.record(id) as Study)
  ];
  // This side's study of the month is the one live here; the file's, the one that is not (new, or deleted here).
  const fromFile = (x: Study) => {
    const here = local.record(x.id);
    return plan.incoming.has(x.id) && (!here || !isLive(here));
  };
  for (const study of monthsToCheck) {
    if (pause()) yield;
    if (seenMonths.has(study)) continue;
    // A month of one study cannot hold two: most of a file's months, answered without building their lists.
    if (planned.studyCountOfMonth(study.characteristicId, study.period) < 2) continue;
    const peers = planned
      .studiesOfMonth(study.characteristicId, study.period)
      .filter((st) => isLive(st) || restorable.has(st.id) || mayRevive.has(st.id));
    if (peers.length < 2) continue;
    seenMonths.add(study);
    const [a, b] = peers.sort(
      (x, y) => Number(fromFile(x)) - Number(fromFile(y)) || (x.id < y.id ? -1 : 1)
    ) as [Study, Study];
    const revivable = [a, b].find((x) => mayRevive.has(x.id) && !isLive(x));
    months.push({
      key: monthConflictKey(study),
      type: 'same-month',
      kind: 'studies',
      nature: 'same-month',
      local: a,
      incoming: b,
      fields: differingFields(a, b),
      canCombine: canCombineStudies(a, b),
      ...(revivable ? { revivable: revivable.id } : {})
    });
  }

  // A month both sides hold a live study of, that merging would leave with none: each side deleted the other's
  // study (two devices that settled the same month by different choices, or two people who each replaced the
  // other's). Asked, never left empty; settling brings the chosen study back.
  for (const study of incoming.studies) {
    if (pause()) yield;
    if (!isLive(study)) continue;
    if (seenMonths.has(study)) continue;
    // Answered without building the month's list where it is plain: no study of the month here, or this very
    // study live here in the same month (a device's whole file received again, as folder sync does).
    if (local.studyCountOfMonth(study.characteristicId, study.period) === 0) continue;
    const same = local.record(study.id) as Study | undefined;
    if (
      same &&
      isLive(same) &&
      same.characteristicId === study.characteristicId &&
      same.period === study.period
    )
      continue;
    const here = local.studiesOfMonth(study.characteristicId, study.period).filter(isLive);
    if (here.length === 0 || here.some((h) => h.id === study.id)) continue;
    const after = planned
      .studiesOfMonth(study.characteristicId, study.period)
      .filter((st) => isLive(st) || restorable.has(st.id));
    if (after.length > 0) continue;
    seenMonths.add(study);
    const a = here[0] as Study;
    months.push({
      key: monthConflictKey(study),
      type: 'same-month',
      kind: 'studies',
      nature: 'emptied-month',
      local: a,
      incoming: study,
      fields: differingFields(a, study),
      canCombine: canCombineStudies(a, study)
    });
  }

  plan.conflicts = [...families.values(), ...recordConflicts.values(), ...months];
  plan.counts.conflict = plan.conflicts.length;

  const missing = new Map<RecordKind, number>();
  // Parents found, asked again from this small set: a characteristic is asked for by each of its studies.
  const found = new Set<string>();
  for (const { kind, record } of plan.incoming.values()) {
    if (pause()) yield;
    const parent = parentIdOf(kind, record);
    if (parent === undefined || !isLive(record) || found.has(parent)) continue;
    if (planned.get(parent)) {
      found.add(parent);
      continue;
    }
    missing.set(kind, (missing.get(kind) ?? 0) + 1);
  }
  for (const [kind, n] of missing) {
    plan.warnings.push(
      `${n} ${KIND_LABEL[kind]} record(s) refer to a ${KIND_LABEL[PARENT_OF[kind]!.kind]} that is neither in the file nor on this device; they are kept and appear once that record arrives (import the earlier file from that device).`
    );
  }
  return plan;
}

/** Conflicts not settled by a per-conflict choice or a rule. */
export function unsettledConflicts(plan: MergePlan, choices: MergeChoices): MergeConflict[] {
  return plan.conflicts.filter((c) => !choices.perConflict?.[c.key] && !choices.rule);
}

/**
 * Which of the family's outcomes the rule "newer edit wins" gives: keep the parent when any edit at stake —
 * the parent's own live version, a live record under it, or the live side of a conflict inside it — is newer
 * than the deletion. Both sides see the same edits and the same deletion, so both decide alike.
 */
function familyKeepsByNewer(c: MergeConflict, planned: RecordIndex): boolean {
  const tombstone = c.nature === 'deleted-there' ? c.incoming : c.local;
  if (!tombstone) return true;
  const edits: RecordMeta[] = planned
    .descendantsOf(c.kind, c.key)
    .filter((d) => isLive(d.record))
    .map((d) => d.record);
  for (const { decision } of c.absorbed ?? []) {
    const live = liveSideOf(decision) === 'local' ? decision.local : decision.incoming;
    if (live) edits.push(live);
  }
  for (const v of [c.local, c.incoming]) if (v && isLive(v)) edits.push(v);
  return edits.some((e) => compareEdits(e, tombstone) > 0);
}

/**
 * The records to write for a plan and the choices made: each chosen version, plus the revisions this side
 * writes to settle (studies set aside or combined, parents brought back, records deleted with their parent).
 * Pure and deterministic for a given `ctx`. Throws MergeRefused when a conflict is left unsettled.
 */
export function settleMerge(
  local: RecordIndex,
  plan: MergePlan,
  choices: MergeChoices,
  ctx: WriteContext
): IndexedRecord[] {
  return runToEnd(settleMergeSteps(local, plan, choices, ctx));
}

/** settleMerge in steps (work-steps.ts). */
export function* settleMergeSteps(
  local: RecordIndex,
  plan: MergePlan,
  choices: MergeChoices,
  ctx: WriteContext
): Steps<IndexedRecord[]> {
  const pause = pauseEvery();
  const open = unsettledConflicts(plan, choices);
  if (open.length > 0) {
    throw new MergeRefused(
      `${open.length} conflict(s) are not settled yet: choose a version for each, or a rule`
    );
  }
  const work = local.copy();
  const written = new Map<string, RecordKind>();
  const put = (kind: RecordKind, record: RecordMeta) => {
    work.set(kind, record);
    written.set(record.id, kind);
  };
  const current = (id: string) => work.record(id)!;
  const deletedAt = (at: string): WriteContext => ({ ...ctx, now: () => new Date(at) });

  for (const { kind, decision } of plan.decisions) {
    if (pause()) yield;
    if (decision.kind !== 'conflict' && decision.write) put(kind, decision.write);
  }
  const familyParents: string[] = [];
  for (const c of plan.conflicts) {
    if (pause()) yield;
    const pick = choices.perConflict?.[c.key];
    const rule = choices.rule ?? 'newer';
    if (c.type === 'record') {
      const side = pick === 'local' || pick === 'incoming' ? pick : rule;
      put(c.kind, settleConflict(c.decision!, side));
    } else if (c.type === 'family') {
      const keep =
        pick !== undefined && pick !== 'combine'
          ? (pick === 'local') === (c.nature === 'deleted-there')
          : rule === 'newer'
            ? familyKeepsByNewer(c, work)
            : (rule === 'local') === (c.nature === 'deleted-there');
      const liveSide = c.nature === 'deleted-there' ? 'local' : 'incoming';
      const deadSide = liveSide === 'local' ? 'incoming' : 'local';
      if (c.decision) put(c.kind, settleConflict(c.decision, keep ? liveSide : deadSide));
      else if (keep && !isLive(current(c.key))) put(c.kind, stampRestored(current(c.key), ctx));
      for (const { kind, decision } of c.absorbed ?? []) {
        const live = liveSideOf(decision);
        put(kind, settleConflict(decision, keep ? live : live === 'local' ? 'incoming' : 'local'));
      }
      familyParents.push(c.key);
    }
  }

  // Consistency of families: top-down over every parent this merge touched.
  const touched = new Set<string>(familyParents);
  for (const [id, kind] of written) {
    if (pause()) yield;
    if (PARENT_OF[kind]) touched.add(parentIdOf(kind, current(id))!);
    touched.add(id);
  }
  const restoreUnder = (kind: RecordKind, id: string, instants: Set<string>) => {
    const children = work.childrenOf(kind, id);
    const studiesBack = kind === 'characteristics' ? studiesToRestore(work, children, instants) : undefined;
    for (const child of children) {
      const r = child.record;
      const deletedWith = !isLive(r) && r.deletedAt !== undefined && instants.has(r.deletedAt);
      if (deletedWith && (studiesBack === undefined || studiesBack.has(r.id))) {
        put(child.kind, stampRestored(r, ctx));
      }
      if (isLive(current(r.id))) restoreUnder(child.kind, r.id, instants);
    }
  };
  const deleteUnder = (kind: RecordKind, id: string, at: string) => {
    for (const child of work.childrenOf(kind, id)) {
      if (isLive(child.record)) put(child.kind, stampDeleted(child.record, deletedAt(at)));
      deleteUnder(child.kind, child.record.id, at);
    }
  };
  // Grouped by kind once (a record's kind never changes): each kind's pass then meets only its own records, not
  // every record the merge wrote (a company's file: 762 000, four times over).
  const touchedOfKind = new Map<RecordKind, string[]>(PARENT_KINDS.map((k) => [k, []]));
  for (const id of touched) {
    if (pause()) yield;
    const kind = work.get(id)?.kind;
    if (kind !== undefined) touchedOfKind.get(kind)?.push(id);
  }
  for (const parentKind of PARENT_KINDS) {
    for (const id of touchedOfKind.get(parentKind)!) {
      if (pause()) yield;
      const p = work.get(id);
      if (!p || p.kind !== parentKind) continue;
      const now = p.record;
      if (!isLive(now)) {
        deleteUnder(parentKind, id, now.deletedAt!);
        continue;
      }
      const instants = new Set<string>();
      for (const v of [local.record(id), plan.incoming.get(id)?.record]) {
        if (v?.deletedAt !== undefined) instants.add(v.deletedAt);
      }
      if (instants.size > 0) restoreUnder(parentKind, id, instants);
    }
  }

  // One study per month, settled on the state the families left: a pair where one side is no longer live
  // (its family was deleted) needs nothing more.
  for (const c of plan.conflicts) {
    if (pause()) yield;
    if (c.type !== 'same-month') continue;
    const pick = choices.perConflict?.[c.key];
    const rule = choices.rule ?? 'newer';
    const here = current(c.local!.id) as Study;
    const there = current(c.incoming!.id) as Study;
    const choice: ConflictChoice | 'newer' =
      pick ?? (rule === 'newer' ? 'newer' : rule === 'local' ? 'local' : 'incoming');
    if (c.nature === 'emptied-month') {
      // Both were deleted by the merge; a family choice may already have brought one back, or another study of
      // the month (studiesToRestore).
      if (work.studiesOfMonth(here.characteristicId, here.period).some(isLive)) continue;
      const [a, b] = [c.local as Study, c.incoming as Study];
      if (choice === 'combine') {
        if (!c.canCombine)
          throw new MergeRefused(
            `The two studies of ${b.period} cannot be combined: ${a.data.kind} and ${b.data.kind} data do not pool`
          );
        // As for two live studies: the lower id keeps the pooled data, so two devices that combine agree.
        const [first, second] = [a, b].sort((x, y) => (x.id < y.id ? -1 : 1)) as [Study, Study];
        const restored = stampRestored(current(first.id) as Study, ctx);
        const data = combineStudyData(first.data, second.data);
        put('studies', stampUpdate(restored, { ...editableOf(restored), data } as Editable<Study>, ctx));
      } else {
        const order = compareEdits(a, b) || (a.id < b.id ? 1 : -1);
        const keepHere = choice === 'newer' ? order > 0 : choice === 'local';
        put('studies', stampRestored(keepHere ? here : there, ctx));
      }
      continue;
    }
    if (!isLive(here) || !isLive(there)) continue;
    if (choice === 'combine') {
      if (!c.canCombine)
        throw new MergeRefused(
          `The two studies of ${there.period} cannot be combined: ${here.data.kind} and ${there.data.kind} data do not pool`
        );
      const [first, second] = [here, there].sort((a, b) => (a.id < b.id ? -1 : 1)) as [Study, Study];
      const data = combineStudyData(first.data, second.data);
      put('studies', stampUpdate(first, { ...editableOf(first), data } as Editable<Study>, ctx));
      put('studies', stampDeleted(second, ctx));
    } else {
      // Ties between two different studies fall to the lower id, so both sides decide alike.
      const order = compareEdits(here, there) || (here.id < there.id ? 1 : -1);
      const keepHere = choice === 'newer' ? order > 0 : choice === 'local';
      put('studies', stampDeleted(keepHere ? there : here, ctx));
    }
  }

  const out: IndexedRecord[] = [];
  for (const [id, kind] of written) {
    if (pause()) yield;
    out.push({ kind, record: current(id) });
  }
  yield* assertConsistent(work, out);
  return out;
}

/**
 * Which of a characteristic's studies deleted with its family come back when the family does: at most one per
 * month, and none where the month holds a live study already. Each device deletes the studies it holds with a
 * family, so a family brought back can hold two deleted studies of one month — one from each device — and
 * bringing back both broke "one live study per characteristic and month" (found by the multi-device histories
 * under seed 20261205: the merge then refused every file from that device). Of a month's deleted studies the
 * newest edit comes back (ties: the lower id), so every device chooses alike; the others stay deleted, as the
 * family's deletion left them, behind the family conflict the person was shown.
 */
function studiesToRestore(
  work: RecordIndex,
  children: readonly IndexedRecord[],
  instants: ReadonlySet<string>
): Set<string> {
  const newest = new Map<string, Study>();
  for (const { kind, record } of children) {
    if (kind !== 'studies' || isLive(record) || record.deletedAt === undefined) continue;
    if (!instants.has(record.deletedAt)) continue;
    const study = record as Study;
    const kept = newest.get(study.period);
    if (!kept || (compareEdits(study, kept) || (study.id < kept.id ? 1 : -1)) > 0)
      newest.set(study.period, study);
  }
  const back = new Set<string>();
  for (const study of newest.values())
    if (!work.studiesOfMonth(study.characteristicId, study.period).some(isLive)) back.add(study.id);
  return back;
}

/**
 * The invariants every settled merge keeps, checked on what it writes: no live record under a deleted or
 * missing-but-known parent, and no second live study in a month. A failure here is a bug, never a user error;
 * nothing is written.
 */
function* assertConsistent(work: RecordIndex, writes: readonly IndexedRecord[]): Steps<void> {
  const pause = pauseEvery();
  // Parents found live, asked again from this small set (a characteristic is the parent of each of its studies);
  // `work` does not change here.
  const liveParents = new Set<string>();
  for (const { kind, record } of writes) {
    if (pause()) yield;
    if (!isLive(record)) continue;
    const parentId = parentIdOf(kind, record);
    const parent = parentId === undefined || liveParents.has(parentId) ? undefined : work.record(parentId);
    if (parent && isLive(parent)) liveParents.add(parentId!);
    if (parent && !isLive(parent)) {
      throw new MergeRefused(
        `Merging would leave ${KIND_LABEL[kind]} ${record.id} under a deleted ${KIND_LABEL[PARENT_OF[kind]!.kind]}; nothing was written (please report this)`
      );
    }
    if (kind === 'studies') {
      const s = record as Study;
      // A month of one study cannot hold two live ones: answered without building the month's list.
      if (work.studyCountOfMonth(s.characteristicId, s.period) < 2) continue;
      const live = work.studiesOfMonth(s.characteristicId, s.period).filter(isLive);
      if (live.length > 1) {
        throw new MergeRefused(
          `Merging would leave two live studies for ${s.period} (${live.map((x) => x.id).join(', ')}); nothing was written — preview the file again`
        );
      }
    }
  }
}

/** A whole record set merged with another (the command line's files): records only in `base` stay. */
export function mergedRecordSet(index: RecordIndex): RecordsByKind {
  const out = Object.fromEntries(RECORD_KINDS.map((k) => [k, [] as RecordMeta[]])) as unknown as Record<
    RecordKind,
    RecordMeta[]
  >;
  for (const { kind, record } of index.values()) out[kind].push(travelling(record));
  for (const kind of RECORD_KINDS) sortById(out[kind]);
  return out as unknown as RecordsByKind;
}
