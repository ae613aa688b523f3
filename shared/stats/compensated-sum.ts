// Neumaier's compensated summation, the one implementation: a running sum whose rounding error
// does not grow with the number of terms (step averages, Tafel and trend fits, OCV means, model
// predictions, sums of squared residuals). The class takes terms one at a time; the functions
// below sum an array or a dot product with it.
import { sum } from 'simple-statistics';

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

/**
 * Compensated sum of an array: simple-statistics' sum, the same Neumaier (Kahan–Babuška)
 * algorithm as CompensatedSum; 0 for an empty array.
 * Cost: O(n).
 * @example compensatedSum([1e16, 1, -1e16]) // 1
 */
export function compensatedSum(values: ArrayLike<number>): number {
  return sum(values as number[]);
}

/**
 * Compensated dot product Σ a_i·b_i of two equal-length vectors (the products are rounded once
 * each, their sum is compensated).
 * Cost: O(n).
 * @example compensatedDot([1e16, 1, -1e16], [1, 1, 1]) // 1
 */
export function compensatedDot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const sum = new CompensatedSum();
  for (let i = 0; i < a.length; i++) sum.add(a[i] * b[i]);
  return sum.value();
}

/**
 * Compensated Σ x_i² (sums of squared residuals).
 * Cost: O(n).
 * @example compensatedSumOfSquares([3, 4]) // 25
 */
export function compensatedSumOfSquares(values: ArrayLike<number>): number {
  const sum = new CompensatedSum();
  for (let i = 0; i < values.length; i++) sum.add(values[i] * values[i]);
  return sum.value();
}
