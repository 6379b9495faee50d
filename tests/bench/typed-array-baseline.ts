/**
 * The baseline the ranking and the review are measured against: the work no implementation can avoid, done in
 * the leanest form — per characteristic, pool the window's months (exact pooled mean and variance of summaries,
 * summed counts), compute the normal tails and the z-level, a priority from the shortfall, then sort. The data
 * sit in typed arrays laid out by characteristic and month, filled before the clock starts (getting them there
 * is storage's work, not ranking's).
 */
import { normalCdf, normalSf, normalUpperQuantile } from '../../src/lib/stats/normal-distribution';
import type { PortfolioRecords } from '../../src/lib/domain/portfolio-terms';
import type { Study } from '../../src/lib/domain/study';
import { monthOrdinal } from '../../src/lib/domain/portfolio-index';

export interface TypedPortfolio {
  chars: number;
  months: number;
  firstMonth: number;
  index: Map<string, number>;
  counted: Uint8Array;
  lsl: Float64Array;
  usl: Float64Array;
  /** [char × months + month]: n, mean, sd for measured; units, defectives for counted. */
  n: Float64Array;
  mean: Float64Array;
  sd: Float64Array;
  units: Float64Array;
  defectives: Float64Array;
}

/**
 * Empty arrays for `chars` characteristics, months from `firstPeriod`. Each characteristic takes the next slot
 * when its first study is written (fillTypedPortfolio): slots follow the order the studies arrive in, as the
 * read model's rows do.
 */
export function typedPortfolioOf(chars: number, months: number, firstPeriod: string): TypedPortfolio {
  const size = chars * months;
  return {
    chars,
    months,
    firstMonth: monthOrdinal(firstPeriod),
    index: new Map(),
    counted: new Uint8Array(chars),
    lsl: new Float64Array(chars).fill(NaN),
    usl: new Float64Array(chars).fill(NaN),
    n: new Float64Array(size),
    mean: new Float64Array(size),
    sd: new Float64Array(size),
    units: new Float64Array(size),
    defectives: new Float64Array(size)
  };
}

/** Data kind and limits of each characteristic. */
export function describeCharacteristics(
  t: TypedPortfolio,
  characteristics: PortfolioRecords['characteristics']
): void {
  for (const c of characteristics) {
    const i = t.index.get(c.id);
    if (i === undefined) continue;
    t.counted[i] = c.dataKind === 'counted' ? 1 : 0;
    if (c.lsl !== undefined) t.lsl[i] = c.lsl;
    if (c.usl !== undefined) t.usl[i] = c.usl;
  }
}

/** Writes studies into their cells (the generator hands them over a process at a time). */
export function fillTypedPortfolio(t: TypedPortfolio, studies: readonly Study[]): void {
  for (const s of studies) {
    let c = t.index.get(s.characteristicId);
    if (c === undefined) {
      if (t.index.size === t.chars) continue;
      c = t.index.size;
      t.index.set(s.characteristicId, c);
    }
    const k = c * t.months + (monthOrdinal(s.period) - t.firstMonth);
    const d = s.data;
    if (d.kind === 'summary') {
      t.n[k] = d.n;
      t.mean[k] = d.mean;
      t.sd[k] = d.sd;
    } else if (d.kind === 'defectives') {
      t.units[k] = d.units;
      t.defectives[k] = d.defectives;
    }
  }
}

/** One ranking: window of `window` months ending at month offset `end`; returns the order of characteristics. */
export function typedRanking(t: TypedPortfolio, end: number, window: number, required = 4): Uint32Array {
  const priority = new Float64Array(t.chars);
  for (let c = 0; c < t.chars; c += 1) {
    let z: number;
    if (t.counted[c]) {
      let units = 0;
      let bad = 0;
      for (let m = end - window + 1; m <= end; m += 1) {
        units += t.units[c * t.months + m]!;
        bad += t.defectives[c * t.months + m]!;
      }
      z = normalUpperQuantile(Math.min(1, bad / units));
    } else {
      // Pooled mean and variance of the months (Chan, Golub & LeVeque), as window-study.ts does.
      let n = 0;
      let mean = 0;
      let m2 = 0;
      for (let m = end - window + 1; m <= end; m += 1) {
        const k = c * t.months + m;
        const nb = t.n[k]!;
        if (nb === 0) continue;
        const delta = t.mean[k]! - mean;
        const total = n + nb;
        mean += (delta * nb) / total;
        m2 += t.sd[k]! * t.sd[k]! * (nb - 1) + (delta * delta * n * nb) / total;
        n = total;
      }
      const sd = Math.sqrt(m2 / (n - 1));
      const below = Number.isNaN(t.lsl[c]!) ? 0 : normalCdf((t.lsl[c]! - mean) / sd);
      const above = Number.isNaN(t.usl[c]!) ? 0 : normalSf((t.usl[c]! - mean) / sd);
      z = normalUpperQuantile(Math.min(1, below + above));
    }
    priority[c] = Math.max(0, required - z);
  }
  const order = new Uint32Array(t.chars);
  for (let i = 0; i < order.length; i += 1) order[i] = i;
  return order.sort((a, b) => priority[b]! - priority[a]! || a - b);
}
