import { describe, expect, it } from 'vitest';
import { checkValues, expectAbsolute, expectRelative } from '../../../tests/support/reference-data';
import { c4, c4Exact, CONTROL_CHART_TABLE, d2, d2Exact } from './control-chart-constants';

const constants = checkValues().control_chart_constants;

describe('control-chart constants', () => {
  it.each(Object.keys(CONTROL_CHART_TABLE).map(Number))(
    'n = %i: table d2 and c4 agree with the exact forms to the last published digit',
    (n) => {
      const row = CONTROL_CHART_TABLE[n]!;
      // d2 has 3 decimals, c4 has 4: allow one unit in the last digit plus rounding (1.5 units).
      expectAbsolute(row.d2, d2Exact(n), 1.5e-3, `d2(${n})`);
      expectAbsolute(row.c4, c4Exact(n), 1.5e-4, `c4(${n})`);
    }
  );

  it('the exact forms agree with scipy numeric integration (check-values.json control_chart_constants, 1e-9)', () => {
    for (let n = 2; n <= 25; n += 1) {
      const ref = constants.computed_scipy[String(n)];
      expectRelative(d2Exact(n), ref.d2, 1e-9, `d2(${n})`);
      expectRelative(c4Exact(n), ref.c4, 1e-12, `c4(${n})`);
    }
  });

  it('E2 = 3/d2 reproduces the AIAG SPC manual Table 8B values (n = 2…10, 3 decimals)', () => {
    for (const [n, e2] of Object.entries(constants.published_E2_n2_10.values as Record<string, number>)) {
      expectAbsolute(3 / d2(Number(n)), e2, 1.5e-3, `E2(${n})`);
    }
  });

  it('falls back to the exact forms above 25 and refuses sizes below 2', () => {
    expectRelative(c4(30), c4Exact(30), 1e-15);
    expectRelative(d2(30), d2Exact(30), 1e-15);
    expect(() => d2(1)).toThrow(/A whole subgroup size of at least 2 is needed for d2 \(got 1\)/);
  });
});
