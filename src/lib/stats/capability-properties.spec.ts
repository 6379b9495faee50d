import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeMeasured } from './analyze-measured';

/**
 * Properties any correct capability calculation has (property-based, fast-check): invariance of the indices
 * when data and limits move or scale together, Cpk ≤ Cp and Ppk ≤ Pp, and ppm growing as a limit tightens.
 */
const sample = fc
  .array(fc.double({ min: -100, max: 100, noNaN: true, noDefaultInfinity: true }), {
    minLength: 10,
    maxLength: 60
  })
  .filter((xs) => {
    const lo = Math.min(...xs);
    const hi = Math.max(...xs);
    return hi - lo > 1e-3 && new Set(xs).size > 5;
  });

function limitsAround(xs: number[], a: number, b: number) {
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const span = hi - lo;
  return { lsl: lo - a * span, usl: hi + b * span };
}

const close = (x: number | undefined, y: number | undefined, rel = 1e-9) =>
  x === undefined ? y === undefined : y !== undefined && Math.abs(x - y) <= rel * Math.max(1, Math.abs(y));

describe('capability properties', () => {
  it('indices do not change when data and limits are shifted and scaled together', () => {
    fc.assert(
      fc.property(
        sample,
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (xs, shift, scale, a, b) => {
          const spec = limitsAround(xs, a, b);
          const base = analyzeMeasured(xs, { spec, model: 'normal' });
          const moved = analyzeMeasured(
            xs.map((x) => x * scale + shift),
            { spec: { lsl: spec.lsl * scale + shift, usl: spec.usl * scale + shift }, model: 'normal' }
          );
          for (const key of ['cp', 'cpk', 'pp', 'ppk'] as const)
            expect(close(moved[key], base[key], 1e-7), key).toBe(true);
          expect(close(moved.zLevel, base.zLevel, 1e-6)).toBe(true);
        }
      ),
      { numRuns: 300 }
    );
  });

  it('Cpk ≤ Cp and Ppk ≤ Pp', () => {
    fc.assert(
      fc.property(
        sample,
        fc.double({ min: -0.5, max: 1, noNaN: true }),
        fc.double({ min: -0.5, max: 1, noNaN: true }),
        (xs, a, b) => {
          const spec = limitsAround(xs, a, b);
          if (!(spec.lsl < spec.usl)) return;
          const r = analyzeMeasured(xs, { spec, model: 'normal' });
          if (r.cp !== undefined && r.cpk !== undefined) expect(r.cpk).toBeLessThanOrEqual(r.cp + 1e-12);
          expect(r.ppk as number).toBeLessThanOrEqual((r.pp as number) + 1e-12);
        }
      ),
      { numRuns: 300 }
    );
  });

  it('expected ppm does not fall when a limit tightens', () => {
    fc.assert(
      fc.property(
        sample,
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.01, max: 0.5, noNaN: true }),
        (xs, a, tighten) => {
          const spec = limitsAround(xs, a, a);
          const span = spec.usl - spec.lsl;
          const wide = analyzeMeasured(xs, { spec, model: 'normal' });
          const narrow = analyzeMeasured(xs, {
            spec: { lsl: spec.lsl, usl: spec.usl - tighten * span },
            model: 'normal'
          });
          expect(narrow.ppmTotal as number).toBeGreaterThanOrEqual((wide.ppmTotal as number) * (1 - 1e-12));
        }
      ),
      { numRuns: 300 }
    );
  });
});
