/**
 * Compensated summation (Neumaier 1974, "Rundungsfehleranalyse einiger Verfahren zur Summation endlicher
 * Summen", ZAMM 54: an improved Kahan–Babuška sum). The error bound does not grow with n, which is what keeps
 * the NIST StRD NumAcc sets exact to the last digits where a naive sum loses several.
 */

/**
 * Neumaier-compensated sum of all values, each less `shift` (Σ(x − shift); 0 by default): the one compensated
 * sum of the engine. Example: neumaierSum([1e100, 1, -1e100]) === 1. (sampleVariance fuses two such sums into its
 * single pass over the data, written out there because a call per value would slow the hottest loop.)
 */
export function neumaierSum(values: ArrayLike<number>, shift = 0): number {
  let sum = 0;
  let compensation = 0;
  for (let i = 0; i < values.length; i += 1) {
    const v = (values[i] as number) - shift;
    const t = sum + v;
    if (Math.abs(sum) >= Math.abs(v)) compensation += sum - t + v;
    else compensation += v - t + sum;
    sum = t;
  }
  return sum + compensation;
}
