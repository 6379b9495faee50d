import { normalCdf, normalPdf, normalQuantile, normalSf } from '../normal-distribution';
import { quantileType6 } from '../quantiles';
import { formatParameter, type FitRefusal, type FittedModel } from './fitted-model';

/**
 * Johnson transformation Z = γ + η·f((X − ε)/λ) with the system chosen and the parameters fitted by the
 * quantile-ratio rule of Slifker & Shapiro (1980), "The Johnson System: Selection and Parameter Estimation",
 * Technometrics 22(2): with sample quantiles x at Φ(±z), Φ(±3z), m = x₃z − x_z, n = x₋z − x₋₃z, p = x_z − x₋z,
 * mn/p² > 1 gives the unbounded S_U (f = asinh), < 1 the bounded S_B (f(u) = ln(u/(1−u))), ≈ 1 the lognormal
 * S_L (f = ln, λ = 1). z = 0.524 as suggested there for moderate samples. Parameter formulas reproduced from
 * memory of the paper; the tests check that the fitted model maps the four chosen quantiles back to ±z, ±3z.
 */
export const JOHNSON_Z = 0.524;

export function fitJohnson(sorted: ArrayLike<number>, z: number = JOHNSON_Z): FittedModel | FitRefusal {
  const xs = (k: number) => quantileType6(sorted, normalCdf(k * z));
  const x3 = xs(3);
  const x1 = xs(1);
  const xm1 = xs(-1);
  const xm3 = xs(-3);
  const m = x3 - x1;
  const n = xm1 - xm3;
  const p = x1 - xm1;
  if (!(m > 0 && n > 0 && p > 0))
    return { name: 'johnson', reason: 'the sample quantiles do not spread (too few distinct values)' };
  const mp = m / p;
  const np = n / p;
  const d = (m * n) / (p * p);
  const mid = (x1 + xm1) / 2;
  let parameters: JohnsonParameters;
  if (d > 1.001) {
    const eta = (2 * z) / Math.acosh(0.5 * (mp + np));
    const gamma = eta * Math.asinh((np - mp) / (2 * Math.sqrt(mp * np - 1)));
    const lambda = (2 * p * Math.sqrt(mp * np - 1)) / ((mp + np - 2) * Math.sqrt(mp + np + 2));
    const epsilon = mid + (p * (np - mp)) / (2 * (mp + np - 2));
    parameters = { system: JOHNSON_SU, gamma, eta, epsilon, lambda };
  } else if (d < 0.999) {
    const pm = p / m;
    const pn = p / n;
    const prod = (1 + pm) * (1 + pn);
    const denom = (p * p) / (m * n) - 1;
    const eta = z / Math.acosh(0.5 * Math.sqrt(prod));
    const gamma = eta * Math.asinh(((pn - pm) * Math.sqrt(prod - 4)) / (2 * denom));
    const lambda = (p * Math.sqrt((prod - 2) ** 2 - 4)) / denom;
    const epsilon = mid - lambda / 2 + (p * (pn - pm)) / (2 * denom);
    parameters = { system: JOHNSON_SB, gamma, eta, epsilon, lambda };
  } else {
    const eta = (2 * z) / Math.log(mp);
    const gamma = eta * Math.log((mp - 1) / (p * Math.sqrt(mp)));
    const epsilon = mid - (p / 2) * ((mp + 1) / (mp - 1));
    parameters = { system: JOHNSON_SL, gamma, eta, epsilon, lambda: 0 };
  }
  if (!Object.values(parameters).every(Number.isFinite)) {
    return { name: 'johnson', reason: 'the quantile-ratio equations have no finite solution for these data' };
  }
  const model = johnsonModel(parameters);
  const first = sorted[0] as number;
  const last = sorted[sorted.length - 1] as number;
  if (first <= model.lowerEdge || last >= model.upperEdge) {
    return { name: 'johnson', reason: 'some values lie outside the bounds of the fitted Johnson system' };
  }
  return model;
}

/** Johnson systems, as the numeric code kept in the parameters. */
export const JOHNSON_SU = 1;
export const JOHNSON_SB = 2;
export const JOHNSON_SL = 3;

export interface JohnsonParameters extends Record<string, number> {
  system: number;
  gamma: number;
  eta: number;
  epsilon: number;
  /** Scale (S_U) or range (S_B); 0 for S_L. */
  lambda: number;
}

/**
 * The Johnson model of a system and its parameters, z = γ + η·g((x − ε)/λ) standard normal, with
 * g = asinh (S_U), g(u) = ln(u/(1 − u)) on (ε, ε + λ) (S_B), or z = γ + η·ln(x − ε) (S_L) (Johnson 1949,
 * Biometrika 36). The density is φ(z)·dz/dx.
 */
export function johnsonModel(p: JohnsonParameters): FittedModel & { lowerEdge: number; upperEdge: number } {
  const { system, gamma, eta, epsilon, lambda } = p;
  let zOf: (x: number) => number;
  let slope: (x: number) => number;
  let inverse: (zz: number) => number;
  let label: string;
  let lowerEdge = -Infinity;
  let upperEdge = Infinity;
  if (system === JOHNSON_SU) {
    zOf = (x) => gamma + eta * Math.asinh((x - epsilon) / lambda);
    slope = (x) => eta / (lambda * Math.sqrt(1 + ((x - epsilon) / lambda) ** 2));
    inverse = (zz) => epsilon + lambda * Math.sinh((zz - gamma) / eta);
    label = `Johnson S_U (γ ${formatParameter(gamma)}, η ${formatParameter(eta)}, ε ${formatParameter(epsilon)}, λ ${formatParameter(lambda)})`;
  } else if (system === JOHNSON_SB) {
    lowerEdge = epsilon;
    upperEdge = epsilon + lambda;
    zOf = (x) => gamma + eta * Math.log((x - epsilon) / (epsilon + lambda - x));
    slope = (x) => (eta * lambda) / ((x - epsilon) * (epsilon + lambda - x));
    inverse = (zz) => {
      const e = Math.exp((zz - gamma) / eta);
      return epsilon + (lambda * e) / (1 + e);
    };
    label = `Johnson S_B (γ ${formatParameter(gamma)}, η ${formatParameter(eta)}, bounds ${formatParameter(epsilon)} to ${formatParameter(epsilon + lambda)})`;
  } else {
    lowerEdge = epsilon;
    zOf = (x) => gamma + eta * Math.log(x - epsilon);
    slope = (x) => eta / (x - epsilon);
    inverse = (zz) => epsilon + Math.exp((zz - gamma) / eta);
    label = `Johnson S_L (γ ${formatParameter(gamma)}, η ${formatParameter(eta)}, ε ${formatParameter(epsilon)})`;
  }
  const inside = (x: number) => x > lowerEdge && x < upperEdge;
  return {
    name: 'johnson',
    label,
    parameters: p,
    lowerEdge,
    upperEdge,
    cdf: (x) => (x <= lowerEdge ? 0 : x >= upperEdge ? 1 : normalCdf(zOf(x))),
    pdf: (x) => (inside(x) ? normalPdf(zOf(x)) * slope(x) : 0),
    sf: (x) => (x <= lowerEdge ? 1 : x >= upperEdge ? 0 : normalSf(zOf(x))),
    quantile: (q) => inverse(normalQuantile(q))
  };
}
