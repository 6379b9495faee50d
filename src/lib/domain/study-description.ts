import { summariseMoments } from '../stats/pooled-moments';
import {
  countOf,
  formatAsEntered,
  formatCount,
  formatStatistic,
  PRINTED,
  resolutionOf
} from './figure-format';
import type { StudyData } from './study';

/** How a study's data is described to people: one line, and rows for side-by-side comparison. */

/** A number as entered: its own decimals, never scientific notation. */
const number = (v: number) => formatAsEntered(v, PRINTED);
const count = (v: number) => formatCount(v, PRINTED);

/** The figures of a study's data, as rows a person can compare. */
export function dataRows(data: StudyData): [string, string][] {
  switch (data.kind) {
    case 'raw': {
      const { mean, sd } = summariseMoments(data.values);
      const resolution = resolutionOf(data.values);
      return [
        ['data', countOf(data.values.length, 'measured value', 'measured values', PRINTED)],
        ['n', count(data.values.length)],
        ['mean', formatStatistic(mean, resolution, PRINTED)],
        ['sd', formatStatistic(sd, resolution, PRINTED)]
      ];
    }
    case 'summary':
      return [
        ['data', 'summary (n, mean, sd)'],
        ['n', count(data.n)],
        ['mean', number(data.mean)],
        ['sd', number(data.sd)]
      ];
    case 'defectives':
      return [
        ['data', 'defective units'],
        ['units inspected', count(data.units)],
        ['defective units', count(data.defectives)]
      ];
    case 'defects':
      return [
        ['data', 'defects'],
        ['units inspected', count(data.units)],
        ['defects', count(data.defects)],
        ['opportunities per unit', count(data.opportunitiesPerUnit)]
      ];
  }
}

/** One line: "30 measured values in 6 subgroups", "summary: n 30, mean 10.1, sd 0.2", "3 defective of 1,800 units". */
export function studyDataText(data: StudyData): string {
  switch (data.kind) {
    case 'raw':
      return `${countOf(data.values.length, 'measured value', 'measured values', PRINTED)}${data.subgroups ? ` in ${countOf(new Set(data.subgroups).size, 'subgroup', 'subgroups', PRINTED)}` : ''}`;
    case 'summary':
      return `summary: n ${count(data.n)}, mean ${number(data.mean)}, sd ${number(data.sd)}`;
    case 'defectives':
      return `${count(data.defectives)} defective of ${countOf(data.units, 'unit', 'units', PRINTED)}`;
    case 'defects':
      return `${countOf(data.defects, 'defect', 'defects', PRINTED)} in ${countOf(data.units, 'unit', 'units', PRINTED)} × ${countOf(data.opportunitiesPerUnit, 'opportunity', 'opportunities', PRINTED)}`;
  }
}
