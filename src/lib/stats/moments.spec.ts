import { describe, expect, it } from 'vitest';
import { expectRelative, nistCertified, nistValues } from '../../../tests/support/reference-data';
import { mean, sampleSd } from './moments';
import { neumaierSum } from './summation';

/**
 * Exact sample sd of the doubles as stored: every double is m·2^e, so sums of values and squares are exact
 * in BigInt after scaling by a common power of two. The oracle for "exact sd of the stored doubles".
 */
function exactSdOfDoubles(values: number[]): number {
  const SCALE = 60n; // all test values are ≥ 0.1 with ≤ 53 significant bits: 2^60 makes each an integer
  const ints = values.map((v) => {
    const [mantissa, exponent] = decompose(v);
    const shift = BigInt(exponent) + SCALE;
    return shift >= 0n ? mantissa << shift : mantissa >> -shift;
  });
  const n = BigInt(values.length);
  const s = ints.reduce((a, b) => a + b, 0n);
  const ss = ints.reduce((a, b) => a + b * b, 0n);
  const numerator = n * ss - s * s; // scaled by 2^(2·SCALE)
  const denominator = n * (n - 1n);
  // variance = numerator / denominator / 2^120; take 60 extra bits of quotient precision.
  const q = (numerator << 60n) / denominator;
  return Math.sqrt(Number(q) / 2 ** 180);
}

function decompose(v: number): [bigint, number] {
  const buf = new DataView(new ArrayBuffer(8));
  buf.setFloat64(0, v);
  const bits = buf.getBigUint64(0);
  const exp = Number((bits >> 52n) & 0x7ffn);
  const frac = bits & ((1n << 52n) - 1n);
  if (exp === 0) return [frac, -1074];
  return [frac | (1n << 52n), exp - 1075];
}

describe('mean and standard deviation against NIST StRD certified values', () => {
  const certified = nistCertified();
  // Source: NIST Statistical Reference Datasets, Univariate Summary Statistics (certified to 15 digits).
  it.each(['PiDigits', 'Lottery', 'Lew', 'Mavro', 'Michelso', 'NumAcc1', 'NumAcc2'])(
    '%s: mean and sd to 1e-13 relative',
    (name) => {
      const values = nistValues(name);
      const c = certified[name]!;
      expect(values).toHaveLength(c.n);
      expectRelative(mean(values), Number(c.certified.mean), 1e-13, 'mean');
      expectRelative(sampleSd(values), Number(c.certified.sd), 1e-13, 'sd');
    }
  );

  it.each(['NumAcc3', 'NumAcc4'])(
    '%s: mean to 1e-13, sd within 1e-8 of certified and 1e-12 of the exact sd of the stored doubles',
    (name) => {
      const values = nistValues(name);
      const c = certified[name]!;
      expectRelative(mean(values), Number(c.certified.mean), 1e-13, 'mean');
      const sd = sampleSd(values);
      expectRelative(sd, Number(c.certified.sd), 1e-8, 'sd vs certified');
      expectRelative(sd, exactSdOfDoubles(values), 1e-12, 'sd vs exact sd of the doubles');
    }
  );

  it('the NumAcc4 check has teeth: the naive one-pass formula misses it by far more than the tolerance', () => {
    const values = nistValues('NumAcc4');
    const n = values.length;
    let s = 0;
    let ss = 0;
    for (const v of values) {
      s += v;
      ss += v * v;
    }
    const naive = Math.sqrt(Math.max(0, (ss - (s * s) / n) / (n - 1)));
    expect(Math.abs(naive - exactSdOfDoubles(values)) / exactSdOfDoubles(values)).toBeGreaterThan(1e-6);
  });
});

describe('compensated summation', () => {
  it('keeps what a naive sum loses', () => {
    expect(neumaierSum([1e100, 1, -1e100])).toBe(1);
    // The exact sum of these four doubles is 2^-55 = 2.7755575615628914e-17; a naive left-to-right sum gives 4·that.
    expect(neumaierSum([0.1, 0.2, 0.3, -0.6])).toBe(2 ** -55);
    expect(0.1 + 0.2 + 0.3 - 0.6).toBe(2 ** -53);
  });

  it('refuses too few values', () => {
    expect(() => mean([])).toThrow(/At least 1 value is needed for a mean/);
    expect(() => sampleSd([1])).toThrow(/At least 2 values are needed for a standard deviation/);
  });
});
