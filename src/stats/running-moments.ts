/**
 * Running moments — the count, mean and sum of squared deviations of a stream of numbers, updated in O(1)
 * when one number is added or removed.
 *
 * Source: Welford BP (1962) Note on a method for calculating corrected sums of squares and products,
 * Technometrics 4:419–420 (mean += d/n, M2 += d·(x − new mean)); removal is the same update run
 * backwards (Chan TF, Golub GH, LeVeque RJ (1983) Algorithms for computing the sample variance: analysis
 * and recommendations, The American Statistician 37:242–247).
 * Preconditions: finite numbers; `remove` only a number that was added.
 * Returns: `n`, `mean`, `m2` (sum of squared deviations from the mean; the sample variance is m2/(n − 1)),
 * `m3` and `m4` (sums of cubed and fourth-power deviations, for the skewness and the kurtosis; updated as
 * in Pébay P (2008) Formulas for robust, one-pass parallel computation of covariances and arbitrary-order
 * statistical moments, Sandia report SAND2008-6212, eq. 2.1 with one new value, δ = x − old mean:
 * M4 += δ⁴(n−1)(n²−3n+3)/n³ + 6δ²·M2/n² − 4δ·M3/n, M3 += δ³(n−1)(n−2)/n² − 3δ·M2/n, with the old M2, M3).
 * Validity: removal loses a little precision after very many add/remove cycles (relative ~1e-12 per
 * cycle); `m2` is kept ≥ 0, and `settle` clears the residue when every number left is the same.
 * @example const m = new RunningMoments(); m.add(2); m.add(4); m.mean // 3, m.m2 // 2
 */
export class RunningMoments {
  n = 0;
  mean = 0;
  m2 = 0;
  m3 = 0;
  m4 = 0;

  add(x: number): void {
    const n = ++this.n;
    const d = x - this.mean;
    const dn = d / n;
    const dn2 = dn * dn;
    const term = d * dn * (n - 1);
    this.mean += dn;
    this.m4 += term * dn2 * (n * n - 3 * n + 3) + 6 * dn2 * this.m2 - 4 * dn * this.m3;
    this.m3 += term * dn * (n - 2) - 3 * dn * this.m2;
    this.m2 += term;
  }

  remove(x: number): void {
    if (this.n === 1) {
      this.n = 0;
      this.mean = 0;
      this.m2 = 0;
      this.m3 = 0;
      this.m4 = 0;
      return;
    }
    // the add above run backwards: δ and M2 of the state before x came
    const n = this.n;
    const old = this.mean;
    this.mean = (n * old - x) / (n - 1);
    const d = x - this.mean;
    const dn = d / n;
    const term = d * dn * (n - 1);
    this.m2 = Math.max(0, this.m2 - term);
    this.m3 -= term * dn * (n - 2) - 3 * dn * this.m2;
    this.m4 = Math.max(
      0,
      this.m4 - term * dn * dn * (n * n - 3 * n + 3) - 6 * dn * dn * this.m2 + 4 * dn * this.m3,
    );
    this.n--;
  }

  /** The moments of a list, in one pass. */
  static of(values: Iterable<number>): RunningMoments {
    const m = new RunningMoments();
    for (const x of values) m.add(x);
    return m;
  }

  /** Every number left equals `value`: the mean is exactly it and the spread exactly zero. */
  settle(value: number): void {
    this.mean = value;
    this.m2 = 0;
    this.m3 = 0;
    this.m4 = 0;
  }
}
