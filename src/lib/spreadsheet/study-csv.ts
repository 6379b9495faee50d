import type { Study } from '../domain/study';
import { toCsv } from './spreadsheet-csv';

/** One study's data as reported: values (with subgroups) for raw data, one row otherwise. */
export function studyCsv(study: Study, characteristicName: string): string {
  const d = study.data;
  const head = ['characteristic', 'month'];
  switch (d.kind) {
    case 'raw':
      return toCsv([
        [...head, 'subgroup', 'value'],
        ...d.values.map((v, i) => [characteristicName, study.period, d.subgroups?.[i], v])
      ]);
    case 'summary':
      return toCsv([
        [...head, 'n', 'mean', 'sd'],
        [characteristicName, study.period, d.n, d.mean, d.sd]
      ]);
    case 'defectives':
      return toCsv([
        [...head, 'units', 'defectives'],
        [characteristicName, study.period, d.units, d.defectives]
      ]);
    case 'defects':
      return toCsv([
        [...head, 'units', 'defects', 'opportunities per unit'],
        [characteristicName, study.period, d.units, d.defects, d.opportunitiesPerUnit]
      ]);
  }
}
