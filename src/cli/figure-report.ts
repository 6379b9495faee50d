import {
  formatIndex,
  formatPValue,
  formatSignificant,
  formatStatistic,
  PRINTED,
  writeFigure,
  type FigureKind
} from '../lib/domain/figure-format';
import type { CapabilityResult, FigureInterval } from '../lib/stats/capability-result';

/**
 * The command line's two outputs: a JSON object (numbers as numbers; an unbounded interval end is null) and a
 * plain table for people. The probability-plot points stay out of both (they are for charts).
 */
export function toJson(result: CapabilityResult | Record<string, unknown>): string {
  const { probabilityPlot: _plot, ...rest } = result as CapabilityResult;
  return JSON.stringify(
    rest,
    (_key, value: unknown) => (typeof value === 'number' && !Number.isFinite(value) ? null : value),
    2
  );
}

/** Each figure of the table with its label and how the figure policy writes it. */
const LABELS: [keyof CapabilityResult, string, FigureKind | 'statistic' | 'proportion'][] = [
  ['n', 'n', 'count'],
  ['mean', 'mean', 'statistic'],
  ['sdOverall', 'sd overall (n − 1)', 'statistic'],
  ['sdWithin', 'sd within', 'statistic'],
  ['cp', 'Cp', 'index'],
  ['cpk', 'Cpk', 'index'],
  ['pp', 'Pp', 'index'],
  ['ppk', 'Ppk', 'index'],
  ['cpm', 'Cpm', 'index'],
  ['p', 'fraction of units defective p', 'proportion'],
  ['dpu', 'defects per unit (DPU)', 'proportion'],
  ['dpmo', 'defects per million opportunities (DPMO)', 'ppm'],
  ['ppmBelow', 'ppm below LSL', 'ppm'],
  ['ppmAbove', 'ppm above USL', 'ppm'],
  ['ppmTotal', 'ppm total (expected)', 'ppm'],
  ['ppmObserved', 'ppm observed', 'ppm'],
  ['ppmTotalWithin', 'ppm total from within sigma', 'ppm'],
  ['yield', 'yield', 'yield'],
  ['zLevel', 'z-level (one-tail equivalent of the total)', 'index'],
  ['zMin', 'zMin (nearer limit, = 3·Ppk)', 'index'],
  ['zLevelWithin', 'z-level from within sigma', 'index'],
  ['zLevelShortTerm', 'short-term sigma level (shift added)', 'index']
];

/** For defect counts each figure says which rate it is of: per opportunity, or per unit. */
const DEFECT_LABELS: Partial<Record<keyof CapabilityResult, string>> = {
  zLevel: 'z-level of the defect rate per opportunity',
  yield: 'yield per unit (no defect, e^(−DPU))'
};

/** Figures of the models compared and of the tests: three significant digits, never scientific notation. */
const show = (v: number) => formatSignificant(v, 3, PRINTED);

/** "[lo, hi] 95 %; one-sided lower …", each end written as the figure is. */
function intervalText(iv: FigureInterval | undefined, write: (v: number) => string): string {
  if (!iv) return '';
  const pct = `${Math.round(iv.level * 1000) / 10} %`;
  const bound =
    iv.lowerBound !== undefined
      ? `; one-sided lower ${write(iv.lowerBound)}`
      : iv.upperBound !== undefined
        ? `; one-sided upper ${write(iv.upperBound)}`
        : '';
  return `  [${write(iv.lower)}, ${write(iv.upper)}] ${pct}${bound}`;
}

/**
 * The figures for people, written by the figure policy (domain/figure-format.ts); `resolution` is the decimals
 * of the data (the mean and sds are written one finer), unknown for counts.
 */
export function toTable(result: CapabilityResult, resolution?: number): string {
  const lines: string[] = [];
  lines.push(`model   ${result.modelLabel}`);
  lines.push(`method  ${result.method}`);
  lines.push('');
  const width = Math.max(...LABELS.map(([, l]) => l.length));
  // For defect counts the result's ppm figures are DPMO, listed once under their own name.
  const skip = result.kind === 'defects' ? new Set(['ppmTotal']) : new Set<string>();
  for (const [key, label, kind] of LABELS) {
    const v = result[key];
    if (typeof v !== 'number' || skip.has(key)) continue;
    const write = (x: number) =>
      kind === 'statistic'
        ? resolution !== undefined
          ? formatStatistic(x, resolution, PRINTED)
          : formatSignificant(x, 6, PRINTED)
        : kind === 'proportion'
          ? formatSignificant(x, 3, PRINTED)
          : writeFigure(kind, x, PRINTED);
    const named = result.kind === 'defects' ? (DEFECT_LABELS[key] ?? label) : label;
    lines.push(`${named.padEnd(width)}  ${write(v)}${intervalText(result.intervals[key as string], write)}`);
  }
  if (result.normality) {
    lines.push('');
    lines.push(
      `normality  Anderson–Darling A² ${show(result.normality.ad)}, A²* ${show(result.normality.adAdjusted)}, p ${formatPValue(result.normality.p, PRINTED)}`
    );
  }
  if (result.stability) lines.push(`stability  ${result.stability.description}`);
  if (result.models?.length) {
    lines.push('');
    lines.push('models compared (best first):');
    for (const m of result.models) {
      lines.push(
        `  ${m.accepted ? '✓' : '·'} ${m.label}${m.ad !== undefined ? `  A² ${show(m.ad)}` : ''}${m.p !== undefined ? `  p ${formatPValue(m.p, PRINTED)}` : ''} — ${m.note}`
      );
    }
  }
  if (result.requirement) {
    const r = result.requirement;
    const name = r.index === 'cpk' ? 'Cpk' : 'Ppk';
    lines.push('');
    lines.push(
      `${name} ≥ ${r.threshold} with ${Math.round(r.level * 100)} % confidence: ${r.shown ? 'yes' : 'not shown'} (estimate ${formatIndex(r.estimate, PRINTED)}, one-sided lower bound ${formatIndex(r.lowerBound, PRINTED)})`
    );
  }
  lines.push('');
  lines.push('assumptions:');
  for (const a of result.assumptions) lines.push(`  - ${a}`);
  if (result.warnings.length) {
    lines.push('warnings:');
    for (const w of result.warnings) lines.push(`  ! ${w}`);
  }
  lines.push('');
  lines.push(
    'Capability figures support decisions; they do not replace customer requirements, standards or qualified judgement.'
  );
  return lines.join('\n');
}
