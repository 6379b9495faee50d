import { describe, expect, it } from 'vitest';
import { normalQuantile } from './normal-distribution';
import { blomPosition, modelProbabilityPlot } from './probability-plot';

const uniform = { quantile: (p: number) => p };

describe('probability plot against a model', () => {
  it('bounds the smallest and largest of n by the closed forms of Beta(1, n) and Beta(n, 1)', () => {
    // The minimum of n uniforms has P(U₍₁₎ ≤ u) = 1 − (1 − u)ⁿ, so its p-quantile is 1 − (1 − p)^(1/n); the
    // maximum's is p^(1/n) (David & Nagaraja, Order Statistics, §2.1).
    const n = 20;
    const plot = modelProbabilityPlot(
      Array.from({ length: n }, (_, i) => (i + 0.5) / n),
      uniform
    );
    expect(plot.lower[0]).toBeCloseTo(1 - 0.975 ** (1 / n), 6);
    expect(plot.upper[0]).toBeCloseTo(1 - 0.025 ** (1 / n), 6);
    expect(plot.lower[n - 1]).toBeCloseTo(0.025 ** (1 / n), 6);
    expect(plot.upper[n - 1]).toBeCloseTo(0.975 ** (1 / n), 6);
    // Every expected position lies inside its own band.
    plot.expected.forEach((e, i) => {
      expect(e).toBeGreaterThan(plot.lower[i]!);
      expect(e).toBeLessThan(plot.upper[i]!);
    });
  });

  it('puts each value at the model quantile of its Blom position, thinned with first and last kept', () => {
    const sorted = Array.from({ length: 1001 }, (_, i) => i);
    const normal = { quantile: normalQuantile };
    const plot = modelProbabilityPlot(sorted, normal, 0.95, 400);
    expect(plot.value[0]).toBe(0);
    expect(plot.value.at(-1)).toBe(1000);
    expect(plot.value.length).toBeLessThanOrEqual(402);
    expect(plot.expected[0]).toBeCloseTo(normalQuantile(blomPosition(1, 1001)), 12);
    // Blom's position of the median of an odd sample is exactly one half.
    expect(blomPosition(501, 1001)).toBe(0.5);
  });
});
