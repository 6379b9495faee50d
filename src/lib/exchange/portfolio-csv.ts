import type { ProcessRow } from '../domain/portfolio-ranking';
import type { Study } from '../domain/study';
import { toCsv, type CsvCell } from './spreadsheet-csv';

/** The ranked portfolio as the Portfolio page shows it, one row per process, for a spreadsheet. */
export function portfolioCsv(
  rows: readonly ProcessRow[],
  window: { endPeriod: string; windowMonths: number }
): string {
  const header = [
    'rank',
    'process',
    'site',
    'context',
    'status',
    'z-level (as reported)',
    'z-level basis',
    'required z-level',
    'z gap',
    'weakest characteristic',
    'ruling estimate',
    'one-sided bound',
    'required',
    'measure',
    'yield',
    'ppm',
    'cost per year',
    'currency',
    'trend slope (z per month)',
    'assumptions',
    'projects',
    'priority',
    'window ends',
    'window months'
  ];
  const body: CsvCell[][] = rows.map((r, i) => [
    i + 1,
    r.process.name,
    r.site.name,
    r.profile?.label ?? r.process.contextId,
    r.status,
    r.zLevel,
    r.zBasis,
    r.requiredZ,
    r.zGap,
    r.weakest?.characteristic.name,
    r.weakest?.estimate,
    r.weakest?.bound,
    r.weakest?.required,
    r.profile?.measure,
    r.yield,
    r.ppm,
    r.costPerYear,
    r.process.currency,
    r.trendSlope,
    r.badges.join('; '),
    r.projects.map((p) => `${p.phase}: ${p.title}`).join('; '),
    r.priority,
    window.endPeriod,
    window.windowMonths
  ]);
  return toCsv([header, ...body]);
}

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
