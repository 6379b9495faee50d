/**
 * Test helpers: loading the reference data copied into tests/fixtures (with their source notes in
 * tests/fixtures/README.md and the README files beside them) and comparing with a stated relative tolerance.
 */
import { readFileSync } from 'node:fs';
import { expect } from 'vitest';

const fixtures = new URL('../fixtures/', import.meta.url);

export function fixtureText(path: string): string {
  return readFileSync(new URL(path, fixtures), 'utf8');
}

/** One NIST StRD univariate data set as numbers, in file order. */
export function nistValues(name: string): number[] {
  return fixtureText(`nist-strd/${name}.txt`).trim().split(/\r?\n/).map(Number);
}

export interface NistCertified {
  n: number;
  certified: { mean: string; sd: string };
  float64_numpy?: { mean: string; sd_ddof1: string };
  anderson_darling_normal_computed_scipy_1_17?: { A2: number; A2_star: number; p_DAgostino_Stephens: number };
}

export function nistCertified(): Record<string, NistCertified> {
  const raw = JSON.parse(fixtureText('nist-strd/certified.json')) as {
    datasets: Record<string, Record<string, unknown>>;
  };
  const out: Record<string, NistCertified> = {};
  for (const [name, entry] of Object.entries(raw.datasets)) {
    out[name] = {
      ...(entry as unknown as NistCertified),
      anderson_darling_normal_computed_scipy_1_17: entry[
        'anderson_darling_normal_computed_scipy_1.17'
      ] as NistCertified['anderson_darling_normal_computed_scipy_1_17']
    };
  }
  return out;
}

/** The NIST/SEMATECH e-Handbook furnace case study thickness values (168, original order). */
export function furnaceThickness(): number[] {
  return fixtureText('datasets/furnace-oxide-thickness.csv')
    .trim()
    .split(/\r?\n/)
    .slice(1)
    .map((line) => Number(line.split(',')[3]));
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function checkValues(): any {
  return JSON.parse(fixtureText('check-values.json'));
}

/** |actual − expected| ≤ rel·|expected| (or ≤ rel when expected is 0). */
export function expectRelative(actual: number | undefined, expected: number, rel: number, label = ''): void {
  expect(actual, label).toBeTypeOf('number');
  const scale = expected === 0 ? 1 : Math.abs(expected);
  const error = Math.abs((actual as number) - expected) / scale;
  expect(
    error,
    `${label} ${actual} vs ${expected}: relative error ${error.toExponential(2)} > ${rel}`
  ).toBeLessThanOrEqual(rel);
}

/** |actual − expected| ≤ abs. */
export function expectAbsolute(actual: number | undefined, expected: number, abs: number, label = ''): void {
  expect(actual, label).toBeTypeOf('number');
  expect(Math.abs((actual as number) - expected), `${label} ${actual} vs ${expected}`).toBeLessThanOrEqual(
    abs
  );
}
