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
  return pairInto({ n: 0, mean: 0, sd: 0 }, a.n, a.mean, a.sd, b.n, b.mean, b.sd);
}

/** The pairwise update of Chan, Golub & LeVeque, written into `out` (which may be the first sample itself). */
function pairInto(
  out: Moments,
  nA: number,
  meanA: number,
  sdA: number,
  nB: number,
  meanB: number,
  sdB: number
): Moments {
  const n = nA + nB;
  const delta = meanB - meanA;
  const mean = meanA + (delta * nB) / n;
  const m2 = sdA * sdA * (nA - 1) + sdB * sdB * (nB - 1) + (delta * delta * nA * nB) / n;
  out.n = n;
  out.mean = mean;
  out.sd = Math.sqrt(m2 / (n - 1));
  return out;
}

/**
 * Samples pooled one after another: the moments as poolMoments folds them from the first (each merge taking the
 * sd the previous one gave), and the sums of pooledWithinSd. One object reused for any number of samples, so
 * that the portfolio's read model pools the months of a window from its typed arrays without an object per month
 * (at company size those objects were a tenth of the quarterly review's time).
 */
export class MomentsFold implements Moments {
  n = 0;
  mean = 0;
  sd = 0;
  /** Samples added since the last reset. */
  count = 0;
  #df = 0;
  #ss = 0;

  reset(): this {
    this.n = this.mean = this.sd = this.count = this.#df = this.#ss = 0;
    return this;
  }

  add(n: number, mean: number, sd: number): void {
    if (this.count === 0) {
      this.n = n;
      this.mean = mean;
      this.sd = sd;
    } else pairInto(this, this.n, this.mean, this.sd, n, mean, sd);
    this.count += 1;
    this.#df += n - 1;
    this.#ss += (n - 1) * sd * sd;
  }

  /** pooledWithinSd of the samples added. */
  withinSd(): number | undefined {
    return this.#df > 0 ? Math.sqrt(this.#ss / this.#df) : undefined;
  }
}

/** Pooled within-sample sd of the parts, or undefined when they hold no degree of freedom. */
export function pooledWithinSd(parts: readonly Moments[]): number | undefined {
  const fold = new MomentsFold();
  for (const p of parts) fold.add(p.n, p.mean, p.sd);
  return fold.withinSd();
}
