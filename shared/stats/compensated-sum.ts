// A running sum whose rounding error does not grow with the number of terms (step averages,
// Tafel fits and OCV means over long curves).

/**
 * Neumaier's compensated sum, fed one term at a time: alongside the running sum it keeps the
 * rounding error of every addition (taken from whichever operand is larger in magnitude), and
 * value() adds that error back, so the error stays at one rounding whatever the number of terms.
 * Reference: Neumaier (1974), ZAMM 54, 39–51 (an improvement of Kahan summation).
 * Cost: O(1) per add, O(1) memory.
 * @throws never (non-finite terms propagate as in ordinary addition).
 * @example const s = new CompensatedSum(); s.add(1e16); s.add(1); s.add(-1e16); s.value() // 1
 */
export class CompensatedSum {
  private sum = 0;
  private compensation = 0;
  add(value: number): void {
    const total = this.sum + value;
    if (Math.abs(this.sum) >= Math.abs(value)) this.compensation += this.sum - total + value;
    else this.compensation += value - total + this.sum;
    this.sum = total;
  }
  value(): number {
    return this.sum + this.compensation;
  }
}
