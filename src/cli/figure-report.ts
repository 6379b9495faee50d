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

const LABELS: [keyof CapabilityResult, string][] = [
  ['n', 'n'],
  ['mean', 'mean'],
  ['sdOverall', 'sd overall (n − 1)'],
  ['sdWithin', 'sd within'],
  ['cp', 'Cp'],
  ['cpk', 'Cpk'],
  ['pp', 'Pp'],
  ['ppk', 'Ppk'],
  ['cpm', 'Cpm'],
  ['p', 'fraction defective p'],
  ['dpu', 'DPU'],
  ['dpmo', 'DPMO'],
  ['ppmBelow', 'ppm below LSL'],
  ['ppmAbove', 'ppm above USL'],
  ['ppmTotal', 'ppm total (expected)'],
  ['ppmObserved', 'ppm observed'],
  ['ppmTotalWithin', 'ppm total from within sigma'],
  ['yield', 'yield'],
  ['zLevel', 'z-level (one-tail equivalent of the total)'],
  ['zMin', 'zMin (nearer limit, = 3·Ppk)'],
  ['zLevelWithin', 'z-level from within sigma'],
  ['zLevelShortTerm', 'short-term sigma level (shift added)']
];

function show(v: number): string {
  if (!Number.isFinite(v)) return v > 0 ? '∞' : '−∞';
  if (Number.isInteger(v)) return String(v);
  const a = Math.abs(v);
  return a !== 0 && (a < 1e-3 || a >= 1e7) ? v.toExponential(4) : v.toPrecision(6).replace(/\.?0+$/, '');
}

function intervalText(iv: FigureInterval | undefined): string {
  if (!iv) return '';
  const pct = `${Math.round(iv.level * 1000) / 10} %`;
  const bound =
    iv.lowerBound !== undefined
      ? `; one-sided lower ${show(iv.lowerBound)}`
      : iv.upperBound !== undefined
        ? `; one-sided upper ${show(iv.upperBound)}`
        : '';
  return `  [${show(iv.lower)}, ${show(iv.upper)}] ${pct}${bound}`;
}

export function toTable(result: CapabilityResult): string {
  const lines: string[] = [];
  lines.push(`model   ${result.modelLabel}`);
  lines.push(`method  ${result.method}`);
  lines.push('');
  const width = Math.max(...LABELS.map(([, l]) => l.length));
  for (const [key, label] of LABELS) {
    const v = result[key];
    if (typeof v !== 'number') continue;
    const shown = key === 'yield' ? `${show(v * 100)} %` : show(v);
    lines.push(`${label.padEnd(width)}  ${shown}${intervalText(result.intervals[key as string])}`);
  }
  if (result.normality) {
    lines.push('');
    lines.push(
      `normality  Anderson–Darling A² ${show(result.normality.ad)}, A²* ${show(result.normality.adAdjusted)}, p ${show(result.normality.p)}`
    );
  }
  if (result.stability) lines.push(`stability  ${result.stability.description}`);
  if (result.models?.length) {
    lines.push('');
    lines.push('models compared (best first):');
    for (const m of result.models) {
      lines.push(
        `  ${m.accepted ? '✓' : '·'} ${m.label}${m.ad !== undefined ? `  A² ${show(m.ad)}` : ''}${m.p !== undefined ? `  p ${show(m.p)}` : ''} — ${m.note}`
      );
    }
  }
  if (result.requirement) {
    const r = result.requirement;
    const name = r.index === 'cpk' ? 'Cpk' : 'Ppk';
    lines.push('');
    lines.push(
      `${name} ≥ ${r.threshold} with ${Math.round(r.level * 100)} % confidence: ${r.shown ? 'yes' : 'not shown'} (estimate ${show(r.estimate)}, one-sided lower bound ${show(r.lowerBound)})`
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
