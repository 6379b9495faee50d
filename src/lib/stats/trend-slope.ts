/**
 * Least-squares slope of values against their position (0, 1, 2, …), skipping missing or non-finite values:
 * b = Σ(x − x̄)(y − ȳ) / Σ(x − x̄)² (ordinary least squares). Undefined with fewer than `minPoints` points.
 */
export function leastSquaresSlope(
  values: readonly (number | undefined)[],
  minPoints = 3
): number | undefined {
  let n = 0;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < values.length; i++) {
    const y = values[i];
    if (y === undefined || !Number.isFinite(y)) continue;
    n++;
    sx += i;
    sy += y;
  }
  if (n < minPoints) return undefined;
  const mx = sx / n;
  const my = sy / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < values.length; i++) {
    const y = values[i];
    if (y === undefined || !Number.isFinite(y)) continue;
    sxy += (i - mx) * (y - my);
    sxx += (i - mx) ** 2;
  }
  return sxy / sxx;
}
