/**
 * Moments of samples merged without their values: n, mean and sample sd (divisor n − 1).
 *
 * - `summariseMoments`: Welford's one-value-at-a-time update (Welford 1962, Technometrics 4(3)), stable for
 *   any order of the values;
 * - `poolMoments`: two samples merged exactly by the pairwise update of Chan, Golub & LeVeque (1979, "Updating
 *   formulae and a pairwise algorithm for computing sample variances"):
 *   n = nA + nB, mean = mA + δ·nB/n, M2 = M2A + M2B + δ²·nA·nB/n with δ = mB − mA and M2 = (n − 1)·s²;
 * - `pooledWithinSd`: the within-sample sd of several samples, √(Σ(nᵢ − 1)sᵢ² / Σ(nᵢ − 1)) (the pooled standard
 *   deviation of one-way analysis of variance).
 */
export interface Moments {
  n: number;
  mean: number;
  sd: number;
}

export function summariseMoments(values: ArrayLike<number>): Moments {
  let n = 0;
  let mean = 0;
  let m2 = 0;
  for (let i = 0; i < values.length; i += 1) {
    const x = values[i] as number;
    n += 1;
    const delta = x - mean;
    mean += delta / n;
    m2 += delta * (x - mean);
  }
  return { n, mean, sd: n > 1 ? Math.sqrt(m2 / (n - 1)) : 0 };
}

export function poolMoments(a: Moments, b: Moments): Moments {
  const n = a.n + b.n;
  const delta = b.mean - a.mean;
  const mean = a.mean + (delta * b.n) / n;
  const m2 = a.sd * a.sd * (a.n - 1) + b.sd * b.sd * (b.n - 1) + (delta * delta * a.n * b.n) / n;
  return { n, mean, sd: Math.sqrt(m2 / (n - 1)) };
}

/** Pooled within-sample sd of the parts, or undefined when they hold no degree of freedom. */
export function pooledWithinSd(parts: readonly Moments[]): number | undefined {
  let df = 0;
  let ss = 0;
  for (const p of parts) {
    df += p.n - 1;
    ss += (p.n - 1) * p.sd * p.sd;
  }
  return df > 0 ? Math.sqrt(ss / df) : undefined;
}
