/**
 * Engine benchmarks: each figure beside a baseline measured in the same run on the same data, as a ratio.
 * Prints; asserts nothing (timings depend on the machine). Median of several repetitions.
 */
import { analyzeMeasured } from '../../src/lib/stats/analyze-measured';
import { summaryFigures } from '../../src/lib/stats/summary-figures';

export interface BenchRow {
  name: string;
  /** Processes (or rows, values) the row was measured at, where a size applies. */
  size?: number;
  ms: number;
  baselineName?: string;
  baselineMs?: number;
  target?: string;
  /** Peak resident memory of the process that measured the row (Node) or peak JS heap (browser), in MB. */
  peakMB?: number;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
}

function time(repeats: number, fn: () => unknown): number {
  const out: number[] = [];
  let sink = 0;
  fn(); // warm-up: let the JIT compile before anything is timed
  for (let i = 0; i < repeats; i += 1) {
    const t0 = performance.now();
    const r = fn();
    out.push(performance.now() - t0);
    sink += typeof r === 'number' ? r : 1;
  }
  if (sink === -1) console.log('unreachable');
  return median(out);
}

/** Seeded normal values (xorshift32 + Box–Muller) so every run measures the same data. */
function normalValues(n: number, seed: number): Float64Array {
  let s = seed >>> 0 || 1;
  const u = () => {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    return (s + 0.5) / 4294967296;
  };
  const out = new Float64Array(n);
  for (let i = 0; i < n; i += 1) out[i] = Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return out;
}

/** The bare loop the engine is compared with: two passes over a Float64Array for mean and variance. */
function bareMeanVariance(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i += 1) s += x[i] as number;
  const m = s / x.length;
  let ss = 0;
  for (let i = 0; i < x.length; i += 1) {
    const d = (x[i] as number) - m;
    ss += d * d;
  }
  return ss / (x.length - 1);
}

export function runEngineBench(): BenchRow[] {
  const z = normalValues(1_000_000, 2026);
  const values = z.map((v) => 50 + 0.8 * v);
  const spec = { lsl: 47, usl: 53, target: 50 };
  const skewed = normalValues(100_000, 77).map((v) => Math.exp(0.4 * v) * 10);

  const loop = time(7, () => bareMeanVariance(values));
  const summary = time(7, () => summaryFigures(values, spec).tails.total);
  const loopSort = time(9, () => {
    const v = bareMeanVariance(values);
    Float64Array.from(values).sort();
    return v;
  });
  const full = time(9, () => analyzeMeasured(values, { spec, model: 'normal' }).zLevel);
  const search = time(5, () => analyzeMeasured(skewed, { spec: { usl: 25 }, model: 'auto' }).zLevel);
  // The least any fit must do on these values: sort them, and one pass of mean/variance of the logs.
  const skewedLoop = time(9, () => {
    const logs = skewed.map(Math.log);
    Float64Array.from(skewed).sort();
    return bareMeanVariance(logs);
  });
  return [
    {
      name: 'summary figures, 10⁶ normal values',
      ms: summary,
      baselineName: 'bare two-pass loop',
      baselineMs: loop,
      target: '≤ 3×'
    },
    {
      name: 'full analysis (AD, stability), 10⁶ values',
      ms: full,
      baselineName: 'loop + Float64Array sort',
      baselineMs: loopSort,
      target: '≤ 2×'
    },
    {
      name: 'non-normal model search (six models ranked by A²), 10⁵ skewed values',
      ms: search,
      baselineName: 'sort + log pass over the same values',
      baselineMs: skewedLoop,
      target: '< 500 ms'
    }
  ];
}
