import { decimalMarkOf } from '../domain/locale-number';
import { countOf } from './format';
import type { Characteristic } from '../domain/characteristic';
import { isPeriod } from '../domain/period';
import type { Process } from '../domain/process';
import { ValidationError } from '../domain/validation-error';
import { guessMapping, previewCsv, type CsvPreview } from '../spreadsheet/csv-preview';
import type { ImportMapping } from '../spreadsheet/measurement-import';
import { explainStorageError } from '../storage/storage-errors';
import type { CapstanStorage } from '../storage/storage';
import type { LogMode } from '../storage/study-repository';
import { messageOf } from './error-message';
import { readMeasurementsInWorker, type ImportRead } from './measurement-import-client';

export type ImportStage = 'idle' | 'mapping' | 'reading' | 'review' | 'done';

export interface ImportTargets {
  storage: CapstanStorage;
  timeZone: string;
  targets: { process: Process; characteristic: Characteristic }[];
  defaultPeriod: string;
  enteredBy: string;
}

/**
 * The measurement import as a state machine: idle → mapping (format and columns) → reading (in a worker) →
 * review (nothing written yet) → done, with the way back to the mapping kept at every step so that a wrong
 * mapping never needs the file picked again. The panel only draws it.
 */
export class MeasurementImportState {
  stage = $state<ImportStage>('idle');
  file = $state.raw<File | undefined>(undefined);
  preview = $state.raw<CsvPreview | undefined>(undefined);
  delimiter = $state<',' | ';' | '\t'>(',');
  decimal = $state<'.' | ','>('.');
  valueColumn = $state(0);
  subgroupColumn = $state(-1);
  periodColumn = $state(-1);
  characteristicColumn = $state(-1);
  period = $state('');
  characteristicId = $state('');
  progress = $state(0);
  rowsRead = $state(0);
  result = $state.raw<ImportRead | undefined>(undefined);
  existing = $state.raw<string[]>([]);
  mode = $state<LogMode | ''>('');
  message = $state<string | undefined>(undefined);
  failure = $state<string | undefined>(undefined);
  private cancel: (() => void) | undefined;

  constructor(private readonly ctx: () => ImportTargets) {}

  /** Names a file may use: "Process / Characteristic", and the bare characteristic name where it is unique. */
  matchable(): { id: string; name: string }[] {
    const targets = this.ctx().targets;
    const out: { id: string; name: string }[] = [];
    for (const t of targets) {
      out.push({ id: t.characteristic.id, name: `${t.process.name} / ${t.characteristic.name}` });
      if (targets.filter((x) => x.characteristic.name === t.characteristic.name).length === 1) {
        out.push({ id: t.characteristic.id, name: t.characteristic.name });
      }
    }
    return out;
  }

  nameOf(id: string): string {
    const t = this.ctx().targets.find((x) => x.characteristic.id === id);
    return t ? `${t.process.name} / ${t.characteristic.name}` : id;
  }

  async choose(f: File | undefined): Promise<void> {
    this.failure = undefined;
    this.message = undefined;
    if (!f) return;
    this.file = f;
    // Where the file does not settle its decimal mark, the reader's own decides (decimal-mark.ts).
    const localeMark = decimalMarkOf(typeof navigator === 'undefined' ? undefined : navigator.language);
    const p = previewCsv(await f.slice(0, 64 * 1024).text(), { localeMark });
    this.delimiter = p.delimiter;
    this.decimal = p.decimal;
    this.guessColumns(p);
    this.period = this.ctx().defaultPeriod;
    this.characteristicId = this.ctx().targets[0]?.characteristic.id ?? '';
    this.stage = 'mapping';
  }

  private guessColumns(p: CsvPreview): void {
    this.preview = p;
    const guess = guessMapping(p);
    this.valueColumn = guess.value;
    this.subgroupColumn = guess.subgroup;
    this.periodColumn = guess.period;
    this.characteristicColumn = guess.characteristic;
  }

  async reformat(): Promise<void> {
    if (!this.file) return;
    const head = await this.file.slice(0, 64 * 1024).text();
    this.preview = previewCsv(head, { delimiter: this.delimiter, decimal: this.decimal });
  }

  async start(): Promise<void> {
    const { file, preview } = this;
    if (!file || !preview) return;
    this.failure = undefined;
    if (this.periodColumn < 0 && !isPeriod(this.period)) {
      this.failure = 'Choose a period column, or a month (YYYY-MM) for all rows.';
      return;
    }
    const mapping: ImportMapping = {
      valueColumn: this.valueColumn,
      ...(this.subgroupColumn >= 0 ? { subgroupColumn: this.subgroupColumn } : {}),
      ...(this.periodColumn >= 0 ? { periodColumn: this.periodColumn } : {}),
      ...(this.characteristicColumn >= 0 ? { characteristicColumn: this.characteristicColumn } : {})
    };
    this.progress = 0;
    this.rowsRead = 0;
    this.stage = 'reading';
    const job = readMeasurementsInWorker(
      {
        file,
        delimiter: this.delimiter,
        hasHeader: preview.hasHeader,
        mapping,
        context: {
          decimal: this.decimal,
          ...(this.periodColumn < 0 ? { defaultPeriod: this.period } : {}),
          ...(this.characteristicColumn < 0 ? { defaultCharacteristicId: this.characteristicId } : {}),
          characteristics: this.matchable(),
          timeZone: this.ctx().timeZone
        }
      },
      (fraction, rows) => {
        this.progress = fraction;
        this.rowsRead = rows;
      }
    );
    this.cancel = job.cancel;
    try {
      const read = await job.done;
      const found: string[] = [];
      for (const g of read.groups) {
        if (await this.ctx().storage.studies.findForMonth(g.characteristicId, g.period))
          found.push(`${g.characteristicId}|${g.period}`);
      }
      this.result = read;
      this.existing = found;
      this.mode = '';
      this.stage = 'review';
    } catch (error) {
      const text = error instanceof Error ? error.message : String(error);
      if (text.startsWith('Reading cancelled')) this.message = text;
      else this.failure = text;
      this.stage = 'mapping';
    } finally {
      this.cancel = undefined;
    }
  }

  cancelReading(): void {
    this.cancel?.();
  }

  /** Back to the columns and format, with the same file: a wrong mapping is mended without picking it again. */
  backToMapping(): void {
    this.result = undefined;
    this.failure = undefined;
    this.stage = this.file ? 'mapping' : 'idle';
  }

  reset(): void {
    this.cancel?.();
    this.stage = 'idle';
    this.file = undefined;
    this.preview = undefined;
    this.result = undefined;
  }

  importNothing(): void {
    this.message = 'Nothing was imported.';
    this.reset();
  }

  async commit(): Promise<void> {
    const result = this.result;
    if (!result) return;
    if (this.existing.length > 0 && this.mode === '') {
      this.failure = `${this.existing.length} of these months already have a study: choose whether to replace or combine them.`;
      return;
    }
    this.failure = undefined;
    const { storage, enteredBy } = this.ctx();
    const inputs = result.groups.map((g) => ({
      characteristicId: g.characteristicId,
      period: g.period,
      data: { kind: 'raw', values: Array.from(g.values), ...(g.subgroups ? { subgroups: g.subgroups } : {}) },
      enteredBy
    }));
    try {
      const outcomes = await storage.studies.logMany(
        inputs,
        this.existing.length > 0 ? (this.mode as LogMode) : 'new'
      );
      const count = (a: string) => outcomes.filter((o) => o.action === a).length;
      this.message = `Imported ${countOf(result.goodRows, 'value', 'values')}: ${countOf(count('created'), 'study', 'studies')} created, ${count('replaced')} replaced, ${count('combined')} combined.`;
      this.stage = 'done';
    } catch (error) {
      this.failure =
        error instanceof ValidationError
          ? error.message
          : messageOf(explainStorageError(error, 'The import'));
    }
  }
}
