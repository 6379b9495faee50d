import { describe, expect, it } from 'vitest';
import {
  checkValues,
  expectAbsolute,
  expectRelative,
  furnaceThickness,
  nistValues
} from '../../../../tests/support/reference-data';
import { normalCdf } from '../normal-distribution';
import { quantileType6, sortedCopy } from '../quantiles';
import { boxCoxLambda, fitBoxCox } from './box-cox-fit';
import { fitExponential } from './exponential-fit';
import type { FitRefusal, FittedModel } from './fitted-model';
import { fitGamma } from './gamma-fit';
import { fitJohnson, JOHNSON_Z } from './johnson-fit';
import { fitLognormal } from './lognormal-fit';
import { fitWeibull } from './weibull-fit';

/** Deterministic standard normal stream for the tests (Park–Miller LCG with Box–Muller). */
function normals(n: number, seed = 42): number[] {
  let s = seed;
  const u = () => (s = (s * 16807) % 2147483647) / 2147483647;
  return Array.from({ length: n }, () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u()));
}

function fitted(f: FittedModel | FitRefusal): FittedModel {
  if ('reason' in f) throw new Error(`fit refused: ${f.reason}`);
  return f;
}

const boxCoxRef = checkValues().box_cox.computed_scipy_boxcox_normmax;

describe('Box-Cox λ by profile likelihood (scipy.stats.boxcox_normmax, method mle)', () => {
  it('NIST StRD Lottery', () =>
    expectAbsolute(boxCoxLambda(nistValues('Lottery')), boxCoxRef['Lottery(NIST StRD)'].mle, 1e-5));
  it('furnace thickness', () =>
    expectAbsolute(boxCoxLambda(furnaceThickness()), boxCoxRef['FURNACE thickness'].mle, 1e-5));
  it('Box & Cox (1964) yarn data, i.i.d. case', () =>
    expectAbsolute(
      boxCoxLambda(checkValues().box_cox.yarn_Box_Cox_1964.data_cycles_to_failure),
      checkValues().box_cox.yarn_Box_Cox_1964.computed_numpy.iid_boxcox_normmax_mle,
      1e-5
    ));
  it('refuses non-positive values', () => expect(fitBoxCox([1, 0, 2])).toHaveProperty('reason'));
  it('gives a model whose quantile inverts its CDF, and reports the mass it puts at x ≤ 0', () => {
    const m = fitted(fitBoxCox(nistValues('Lottery')));
    for (const p of [0.1, 0.5, 0.9, 0.99865]) expectRelative(m.cdf(m.quantile(p)), p, 1e-9);
    // λ ≈ 0.76 on data from 4 to 999: about 1.7 % of the fitted normal lies below the x = 0 edge.
    expect(m.parameters.massAtZero).toBeGreaterThan(0.01);
    expect(m.quantile(0.00135)).toBe(0);
    expect(m.cdf(0)).toBe(m.parameters.massAtZero);
  });
});

describe('Johnson system by the Slifker–Shapiro quantile-ratio rule', () => {
  const z = normals(3000);
  const cases: [string, number[], string][] = [
    ['unbounded S_U', z.map((v) => Math.sinh((v - 0.4) / 0.9)), 'S_U'],
    ['bounded S_B', z.map((v) => 1 / (1 + Math.exp(-(v + 0.3) / 1.4))), 'S_B'],
    ['lognormal-like', z.map((v) => 2 + Math.exp(0.6 * v)), '']
  ];
  it.each(cases)(
    '%s: the fitted model maps the four chosen sample quantiles back to ±z, ±3z',
    (_label, data, system) => {
      const sorted = sortedCopy(data);
      const m = fitted(fitJohnson(sorted));
      if (system) expect(m.label).toContain(system);
      for (const k of [-3, -1, 1, 3]) {
        const p = normalCdf(k * JOHNSON_Z);
        expectAbsolute(m.cdf(quantileType6(sorted, p)), p, 1e-9, `k=${k}`);
      }
      for (const p of [0.01, 0.5, 0.99]) expectRelative(m.cdf(m.quantile(p)), p, 1e-9);
    }
  );

  it('recovers the generating S_U parameters from a large sample (within 10 %)', () => {
    const data = normals(20000, 7).map((v) => 5 + 2 * Math.sinh((v - 0.5) / 1.25)); // γ 0.5, η 1.25, ε 5, λ 2
    const m = fitted(fitJohnson(sortedCopy(data)));
    expectRelative(m.parameters.eta, 1.25, 0.1, 'η');
    expectRelative(m.parameters.lambda, 2, 0.1, 'λ');
    // Z = γ + η·asinh((X − ε)/λ) with Z = 1.25·asinh(…) + 0.5 … so γ = 0.5.
    expectAbsolute(m.parameters.gamma, 0.5, 0.15, 'γ');
  });
});

describe('maximum-likelihood fits recover known parameters from large samples', () => {
  const z = normals(20000, 11);
  it('lognormal: μ and σ of the logs exactly', () => {
    const data = z.map((v) => Math.exp(1 + 0.5 * v));
    const m = fitted(fitLognormal(data));
    const logs = data.map(Math.log);
    const mu = logs.reduce((a, b) => a + b, 0) / logs.length;
    expectRelative(m.parameters.mu, mu, 1e-12);
    expectRelative(m.parameters.sigma, 0.5, 0.02);
  });

  it('Weibull: shape 2 and scale 3 (within 3 %), and the likelihood equation holds at the estimate', () => {
    // Inverse CDF sampling from the same normal stream: u = Φ(z).
    const data = z.map((v) => 3 * (-Math.log1p(-normalCdf(v))) ** (1 / 2));
    const m = fitted(fitWeibull(data));
    expectRelative(m.parameters.shape, 2, 0.03);
    expectRelative(m.parameters.scale, 3, 0.03);
    const k = m.parameters.shape as number;
    let a = 0;
    let b = 0;
    let l = 0;
    for (const x of data) {
      a += x ** k;
      b += x ** k * Math.log(x);
      l += Math.log(x);
    }
    expectAbsolute(b / a - 1 / k - l / data.length, 0, 1e-9);
  });

  it('gamma: shape 3 and scale 2 from a sum of exponentials (within 4 %)', () => {
    const u = normals(60000, 5).map((v) => normalCdf(v));
    const data = Array.from(
      { length: 20000 },
      (_, i) => -2 * (Math.log(u[3 * i]!) + Math.log(u[3 * i + 1]!) + Math.log(u[3 * i + 2]!))
    );
    const m = fitted(fitGamma(data));
    expectRelative(m.parameters.shape, 3, 0.04);
    expectRelative(m.parameters.scale, 2, 0.04);
    for (const p of [0.01, 0.5, 0.99]) expectRelative(m.cdf(m.quantile(p)), p, 1e-6);
  });

  it('exponential: the mean, and refusals for values a family cannot hold', () => {
    expectRelative(fitted(fitExponential([1, 2, 3, 6])).parameters.mean, 3, 1e-15);
    expect(fitExponential([-1, 2])).toHaveProperty('reason');
    expect(fitWeibull([0, 1, 2])).toHaveProperty('reason');
    expect(fitGamma([1, -2])).toHaveProperty('reason');
    expect(fitLognormal([3, 0])).toHaveProperty('reason');
  });
});
