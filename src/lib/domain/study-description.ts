import { summariseMoments } from '../stats/pooled-moments';
import type { StudyData } from './study';

/** How a study's data is described to people: one line, and rows for side-by-side comparison. */

const number = (v: number) =>
  Number.isInteger(v) ? v.toLocaleString('en') : String(Number(v.toPrecision(6)));

/** The figures of a study's data, as rows a person can compare. */
export function dataRows(data: StudyData): [string, string][] {
  switch (data.kind) {
    case 'raw': {
      const { mean, sd } = summariseMoments(data.values);
      return [
        ['data', `${data.values.length} measured values`],
        ['n', number(data.values.length)],
        ['mean', number(mean)],
        ['sd', number(sd)]
      ];
    }
    case 'summary':
      return [
        ['data', 'summary (n, mean, sd)'],
        ['n', number(data.n)],
        ['mean', number(data.mean)],
        ['sd', number(data.sd)]
      ];
    case 'defectives':
      return [
        ['data', 'defective units'],
        ['units inspected', number(data.units)],
        ['defective units', number(data.defectives)]
      ];
    case 'defects':
      return [
        ['data', 'defects'],
        ['units inspected', number(data.units)],
        ['defects', number(data.defects)],
        ['opportunities per unit', number(data.opportunitiesPerUnit)]
      ];
  }
}

/** One line: "30 measured values in 6 subgroups", "summary: n 30, mean 10.1, sd 0.2", "3 defective of 1,800 units". */
export function studyDataText(data: StudyData): string {
  switch (data.kind) {
    case 'raw':
      return `${data.values.length} measured values${data.subgroups ? ` in ${new Set(data.subgroups).size} subgroups` : ''}`;
    case 'summary':
      return `summary: n ${number(data.n)}, mean ${number(data.mean)}, sd ${number(data.sd)}`;
    case 'defectives':
      return `${number(data.defectives)} defective of ${number(data.units)} units`;
    case 'defects':
      return `${number(data.defects)} defects in ${number(data.units)} units × ${data.opportunitiesPerUnit} opportunities`;
  }
}
