/**
 * Compensated summation (Neumaier 1974, "Rundungsfehleranalyse einiger Verfahren zur Summation endlicher
 * Summen", ZAMM 54: an improved Kahan–Babuška sum). The error bound does not grow with n, which is what keeps
 * the NIST StRD NumAcc sets exact to the last digits where a naive sum loses several.
 */
export class CompensatedSum {
  private sum = 0;
  private compensation = 0;

  add(value: number): void {
    const t = this.sum + value;
    if (Math.abs(this.sum) >= Math.abs(value)) this.compensation += this.sum - t + value;
    else this.compensation += value - t + this.sum;
    this.sum = t;
  }

  get value(): number {
    return this.sum + this.compensation;
  }
}

/** Neumaier-compensated sum of all values. Example: neumaierSum([1e100, 1, -1e100]) === 1. */
export function neumaierSum(values: ArrayLike<number>): number {
  let sum = 0;
  let compensation = 0;
  for (let i = 0; i < values.length; i += 1) {
    const v = values[i] as number;
    const t = sum + v;
    if (Math.abs(sum) >= Math.abs(v)) compensation += sum - t + v;
    else compensation += v - t + sum;
    sum = t;
  }
  return sum + compensation;
}
