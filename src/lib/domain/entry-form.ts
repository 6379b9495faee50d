import type { Characteristic, DataKind } from './characteristic';
import type { FieldProblem } from './validation-error';
import { parseLocaleNumber, type DecimalMark } from './locale-number';
import { parsePastedValues } from './pasted-values';
import type { StudyData } from './study';
import { countOf, formatAsEntered, PLAIN, PRINTED } from './figure-format';
import { limitsText } from './limits-text';

/**
 * What an entry form holds: text as typed (so a draft restores exactly what the person saw), turned into study
 * data by `studyDataFromForm`. Numbers are read in the person's locale (decimal comma or point).
 */
export interface EntryForm {
  kind: StudyData['kind'];
  n: string;
  mean: string;
  sd: string;
  raw: string;
  units: string;
  defectives: string;
  defects: string;
  opportunities: string;
  note: string;
  /** The decimal mark of pasted values, once the person has said (empty: read it from the values). */
  rawDecimal?: '' | '.' | ',';
}

/** What a new entry starts from: the characteristic's data kind, what it counts and its opportunities per unit. */
type EntryDefaults = DataKind | Pick<Characteristic, 'dataKind' | 'countedAs' | 'opportunitiesPerUnit'>;

/**
 * An empty form for a characteristic: a counted one starts on what it counts (defectives or defects) with its
 * own opportunities per unit, not 1 where the characteristic says 8.
 */
export function emptyEntryForm(defaults: EntryDefaults): EntryForm {
  const c = typeof defaults === 'string' ? { dataKind: defaults } : defaults;
  const countedAs = 'countedAs' in c ? c.countedAs : undefined;
  const opportunities = 'opportunitiesPerUnit' in c ? c.opportunitiesPerUnit : undefined;
  return {
    kind: c.dataKind === 'measured' ? 'summary' : (countedAs ?? 'defectives'),
    n: '',
    mean: '',
    sd: '',
    raw: '',
    units: '',
    defectives: '',
    defects: '',
    opportunities: String(opportunities ?? 1),
    note: ''
  };
}

/**
 * The form of a study as saved, to correct it: its own kind and figures, written with the person's decimal mark
 * (raw values one per line, after their subgroup and a tab where they have one).
 */
export function entryFormOf(
  study: { data: StudyData; note?: string },
  defaults: EntryDefaults,
  decimal: '.' | ','
): EntryForm {
  const text = (v: number) => {
    const plain = formatAsEntered(v, PLAIN);
    return decimal === ',' ? plain.replace('.', ',') : plain;
  };
  const form: EntryForm = { ...emptyEntryForm(defaults), kind: study.data.kind, note: study.note ?? '' };
  const d = study.data;
  switch (d.kind) {
    case 'summary':
      return { ...form, n: String(d.n), mean: text(d.mean), sd: text(d.sd) };
    case 'raw':
      return {
        ...form,
        raw: d.values.map((v, i) => (d.subgroups ? `${d.subgroups[i]}\t${text(v)}` : text(v))).join('\n'),
        rawDecimal: decimal
      };
    case 'defectives':
      return { ...form, units: String(d.units), defectives: String(d.defectives) };
    case 'defects':
      return {
        ...form,
        units: String(d.units),
        defects: String(d.defects),
        opportunities: String(d.opportunitiesPerUnit)
      };
  }
}

export interface FormReading {
  data?: StudyData;
  problems: FieldProblem[];
  /** A line about what was read from pasted values ("40 values in 8 subgroups; header skipped"). */
  rawSummary?: string;
  /**
   * Pasted values whose decimal mark is open (`1,234`): the example and its two readings. The person chooses
   * (form.rawDecimal) before the values are used.
   */
  askDecimal?: { example: string; withPoint: string; withComma: string };
  /** The decimal mark the pasted values were read with. */
  decimalMark?: '.' | ',';
}

function readNumber(
  form: EntryForm,
  field: keyof EntryForm,
  label: string,
  decimal: DecimalMark,
  problems: FieldProblem[],
  whole = false
): number | undefined {
  const text = String(form[field]).trim();
  if (text === '') {
    problems.push({ field, message: `${label} is required` });
    return undefined;
  }
  const v = parseLocaleNumber(text, decimal);
  if (v === undefined) {
    problems.push({ field, message: `${label}: '${text}' is not a number` });
    return undefined;
  }
  if (whole && !Number.isInteger(v)) {
    problems.push({ field, message: `${label} must be a whole number` });
    return undefined;
  }
  return v;
}

/** Reads the form; problems name the field. The domain's study validation runs again when saving. */
export function studyDataFromForm(form: EntryForm, decimal: DecimalMark = 'auto'): FormReading {
  const problems: FieldProblem[] = [];
  switch (form.kind) {
    case 'summary': {
      const n = readNumber(form, 'n', 'n', decimal, problems, true);
      const mean = readNumber(form, 'mean', 'Mean', decimal, problems);
      const sd = readNumber(form, 'sd', 'Standard deviation', decimal, problems);
      if (n !== undefined && n < 2) problems.push({ field: 'n', message: 'n must be at least 2' });
      if (sd !== undefined && sd < 0)
        problems.push({ field: 'sd', message: 'Standard deviation must not be negative' });
      if (problems.length || n === undefined || mean === undefined || sd === undefined) return { problems };
      return { data: { kind: 'summary', n, mean, sd }, problems };
    }
    case 'raw': {
      const localeMark = decimal === ',' ? ',' : '.';
      // The question stays on screen once answered, so the answer can be changed.
      const open = parsePastedValues(form.raw, 'auto', localeMark).decimal;
      const askDecimal = open.ambiguous
        ? {
            example: open.example ?? '',
            withPoint: String(parseLocaleNumber(open.example ?? '', '.') ?? '—'),
            withComma: String(parseLocaleNumber(open.example ?? '', ',') ?? '—')
          }
        : undefined;
      if (askDecimal && !form.rawDecimal) {
        problems.push({
          field: 'raw',
          message: `'${askDecimal.example}' can be read two ways: say whether these values use a decimal point or a decimal comma`
        });
        return { problems, askDecimal };
      }
      const pasted = parsePastedValues(
        form.raw,
        askDecimal ? (form.rawDecimal as '.' | ',') : 'auto',
        localeMark
      );
      for (const p of pasted.problems)
        problems.push({ field: 'raw', message: `line ${p.line}: ${p.message}` });
      if (pasted.values.length === 0 && problems.length === 0)
        problems.push({ field: 'raw', message: 'Type or paste the measured values' });
      const decimalMark = pasted.decimal.mark;
      const groups = pasted.subgroups ? new Set(pasted.subgroups).size : 0;
      const rawSummary = `${countOf(pasted.values.length, 'value', 'values', PRINTED)}${groups ? ` in ${countOf(groups, 'subgroup', 'subgroups', PRINTED)}` : ''}${pasted.header ? `; header '${pasted.header.join(', ')}' skipped` : ''}`;
      if (problems.length)
        return { problems, rawSummary, decimalMark, ...(askDecimal ? { askDecimal } : {}) };
      return {
        ...(askDecimal ? { askDecimal } : {}),
        data: {
          kind: 'raw',
          values: pasted.values,
          ...(pasted.subgroups ? { subgroups: pasted.subgroups } : {})
        },
        problems,
        rawSummary,
        decimalMark
      };
    }
    case 'defectives': {
      const units = readNumber(form, 'units', 'Units inspected', decimal, problems, true);
      const defectives = readNumber(form, 'defectives', 'Defectives', decimal, problems, true);
      if (units !== undefined && units < 1)
        problems.push({ field: 'units', message: 'Units inspected must be at least 1' });
      if (defectives !== undefined && defectives < 0)
        problems.push({ field: 'defectives', message: 'Defectives must not be negative' });
      if (units !== undefined && defectives !== undefined && defectives > units) {
        problems.push({
          field: 'defectives',
          message: `Defectives (${defectives}) cannot exceed units inspected (${units})`
        });
      }
      if (problems.length || units === undefined || defectives === undefined) return { problems };
      return { data: { kind: 'defectives', units, defectives }, problems };
    }
    case 'defects': {
      const units = readNumber(form, 'units', 'Units inspected', decimal, problems, true);
      const defects = readNumber(form, 'defects', 'Defects', decimal, problems, true);
      const opportunities = readNumber(
        form,
        'opportunities',
        'Opportunities per unit',
        decimal,
        problems,
        true
      );
      if (units !== undefined && units < 1)
        problems.push({ field: 'units', message: 'Units inspected must be at least 1' });
      if (defects !== undefined && defects < 0)
        problems.push({ field: 'defects', message: 'Defects must not be negative' });
      if (opportunities !== undefined && opportunities < 1)
        problems.push({ field: 'opportunities', message: 'Opportunities per unit must be at least 1' });
      if (
        units !== undefined &&
        defects !== undefined &&
        opportunities !== undefined &&
        defects > units * opportunities
      ) {
        problems.push({
          field: 'defects',
          message: `Defects (${defects}) cannot exceed units × opportunities (${units * opportunities})`
        });
      }
      if (problems.length || units === undefined || defects === undefined || opportunities === undefined)
        return { problems };
      return { data: { kind: 'defects', units, defects, opportunitiesPerUnit: opportunities }, problems };
    }
  }
}

/** How far outside the limits a value must lie to be questioned: this many specification widths. */
export const FAR_OUTSIDE_WIDTHS = 10;

/**
 * A question to ask before saving when the entered figures are implausible for the characteristic: values or a
 * mean beyond its physical bounds, or further outside its limits than FAR_OUTSIDE_WIDTHS specification widths
 * (a unit or decimal-mark slip, such as 0,213 read as 213). Undefined when nothing needs asking. The width is
 * USL − LSL, or for one limit the distance to the target, or the limit's own size.
 */
export function implausibleEntry(
  data: StudyData,
  characteristic: Pick<Characteristic, 'lsl' | 'usl' | 'target' | 'physicalMin' | 'physicalMax' | 'unit'>
): string | undefined {
  let low: number;
  let high: number;
  let what: string;
  if (data.kind === 'raw') {
    low = Infinity;
    high = -Infinity;
    for (const v of data.values) {
      if (v < low) low = v;
      if (v > high) high = v;
    }
    what = `values from ${low} to ${high}`;
  } else if (data.kind === 'summary') {
    low = high = data.mean;
    what = `a mean of ${data.mean}`;
  } else return undefined;
  const unit = characteristic.unit ? ` ${characteristic.unit}` : '';
  const { lsl, usl, target, physicalMin, physicalMax } = characteristic;
  if (physicalMin !== undefined && low < physicalMin)
    return `These are ${what}${unit}, below the physical minimum of ${physicalMin}${unit}: check the unit and the decimal mark.`;
  if (physicalMax !== undefined && high > physicalMax)
    return `These are ${what}${unit}, above the physical maximum of ${physicalMax}${unit}: check the unit and the decimal mark.`;
  const width =
    lsl !== undefined && usl !== undefined
      ? usl - lsl
      : target !== undefined && (lsl ?? usl) !== undefined
        ? Math.abs((lsl ?? usl)! - target)
        : Math.abs(lsl ?? usl ?? 0) || 1;
  const margin = FAR_OUTSIDE_WIDTHS * width;
  const limits = limitsText({ lsl, usl }, PRINTED, ', ');
  if (
    (lsl !== undefined && low < lsl - margin) ||
    (usl !== undefined && high > usl + margin) ||
    (lsl === undefined && usl !== undefined && low < usl - margin * 10) ||
    (usl === undefined && lsl !== undefined && high > lsl + margin * 10)
  ) {
    return `These are ${what}${unit}, far outside the limits (${limits}${unit}): check the unit and the decimal mark.`;
  }
  return undefined;
}
