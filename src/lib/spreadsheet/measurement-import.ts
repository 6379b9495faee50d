import { parseLocaleNumber } from '../domain/locale-number';
import { periodFromCell } from './period-from-cell';

/**
 * Turns CSV rows into one group of values per characteristic and month, row by row, so that it can run over a
 * file of millions of rows as it streams (in a worker). Nothing is written here: the caller shows the summary
 * and, if the person agrees, logs the groups in one transaction.
 */
export interface ImportMapping {
  /** 0-based column of the measured value. */
  valueColumn: number;
  subgroupColumn?: number;
  /** A column with a month, date or timestamp; without it every row belongs to `defaultPeriod`. */
  periodColumn?: number;
  /** A column naming the characteristic; without it every row belongs to `defaultCharacteristicId`. */
  characteristicColumn?: number;
}

export interface ImportContext {
  decimal: '.' | ',';
  defaultPeriod?: string;
  defaultCharacteristicId?: string;
  /** Characteristics a name in the characteristic column may match (case and spacing ignored). */
  characteristics: { id: string; name: string }[];
  timeZone: string;
}

export interface ImportGroup {
  characteristicId: string;
  period: string;
  values: number[];
  subgroups?: string[];
}

export interface BadRow {
  line: number;
  reason: string;
}

export interface ReceiveResult {
  groups: ImportGroup[];
  goodRows: number;
  badRows: BadRow[];
  /** All bad rows, also those beyond the listed ones. */
  badCount: number;
}

const MAX_LISTED_BAD_ROWS = 500;

const normalise = (name: string) => name.trim().toLowerCase().replace(/\s+/g, ' ');

export class MeasurementImportAccumulator {
  private readonly groups = new Map<string, ImportGroup>();
  private readonly byName: Map<string, string>;
  private goodRows = 0;
  private badCount = 0;
  private readonly badRows: BadRow[] = [];

  constructor(
    private readonly mapping: ImportMapping,
    private readonly context: ImportContext
  ) {
    if (mapping.periodColumn === undefined && !context.defaultPeriod)
      throw new RangeError('Choose a period column or a month for all rows');
    if (mapping.characteristicColumn === undefined && !context.defaultCharacteristicId) {
      throw new RangeError('Choose a characteristic column or one characteristic for all rows');
    }
    this.byName = new Map(context.characteristics.map((c) => [normalise(c.name), c.id]));
  }

  private bad(line: number, reason: string): void {
    this.badCount += 1;
    if (this.badRows.length < MAX_LISTED_BAD_ROWS) this.badRows.push({ line, reason });
  }

  /** One row of cells; `line` is its 1-based line in the file. Blank rows are skipped silently. */
  addRow(cells: readonly string[], line: number): void {
    if (cells.every((c) => c.trim() === '')) return;
    const m = this.mapping;
    const cell = cells[m.valueColumn];
    if (cell === undefined || cell.trim() === '')
      return this.bad(line, `column ${m.valueColumn + 1}: the value is empty`);
    const value = parseLocaleNumber(cell, this.context.decimal);
    if (value === undefined)
      return this.bad(line, `column ${m.valueColumn + 1}: '${cell.slice(0, 40)}' is not a number`);
    let period = this.context.defaultPeriod as string;
    if (m.periodColumn !== undefined) {
      const text = cells[m.periodColumn] ?? '';
      const p = periodFromCell(text, this.context.timeZone);
      if (!p)
        return this.bad(
          line,
          `column ${m.periodColumn + 1}: '${text.slice(0, 40)}' is not a month, date or timestamp`
        );
      period = p;
    }
    let characteristicId = this.context.defaultCharacteristicId as string;
    if (m.characteristicColumn !== undefined) {
      const name = cells[m.characteristicColumn] ?? '';
      const id = this.byName.get(normalise(name));
      if (!id)
        return this.bad(
          line,
          `column ${m.characteristicColumn + 1}: no characteristic named '${name.slice(0, 60)}' at this site`
        );
      characteristicId = id;
    }
    let subgroup: string | undefined;
    if (m.subgroupColumn !== undefined) {
      subgroup = (cells[m.subgroupColumn] ?? '').trim();
      if (subgroup === '') return this.bad(line, `column ${m.subgroupColumn + 1}: the subgroup id is empty`);
    }
    const key = `${characteristicId}|${period}`;
    let group = this.groups.get(key);
    if (!group) {
      group = { characteristicId, period, values: [], ...(subgroup !== undefined ? { subgroups: [] } : {}) };
      this.groups.set(key, group);
    }
    group.values.push(value);
    if (subgroup !== undefined) group.subgroups?.push(subgroup);
    this.goodRows += 1;
  }

  result(): ReceiveResult {
    const groups = [...this.groups.values()].sort(
      (a, b) => a.period.localeCompare(b.period) || a.characteristicId.localeCompare(b.characteristicId)
    );
    return { groups, goodRows: this.goodRows, badRows: [...this.badRows], badCount: this.badCount };
  }
}
