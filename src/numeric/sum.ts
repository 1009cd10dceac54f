/**
 * Neumaier's compensated summation: the error stays near one rounding of the
 * total, whatever the number of terms. Long sums such as sum V_e (s_e/s0)^m over
 * a million elements lose digits with a plain loop.
 */
export class CompensatedSum {
  private total = 0;
  private compensation = 0;

  add(x: number): void {
    const t = this.total + x;
    if (Math.abs(this.total) >= Math.abs(x)) this.compensation += this.total - t + x;
    else this.compensation += x - t + this.total;
    this.total = t;
  }

  get value(): number {
    return this.total + this.compensation;
  }
}

export function compensatedSum(values: ArrayLike<number>): number {
  const acc = new CompensatedSum();
  for (let i = 0; i < values.length; i++) acc.add(values[i]);
  return acc.value;
}
