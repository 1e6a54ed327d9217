/**
 * Running moments of primary units for the ratio mean: the number of units, the means of their totals y and
 * sizes m, and the centred sums of squares and cross-products, updated in O(1) when one unit gains an entry
 * (the unit's old (y, m) pair is taken out and the new one put in).
 *
 * Source: Welford BP (1962) "Note on a method for calculating corrected sums of squares and products",
 * Technometrics 4(3):419–420 (the running update of corrected sums of products); removal is the same update
 * run backwards (Chan TF, Golub GH & LeVeque RJ 1983, "Algorithms for computing the sample variance",
 * The American Statistician 37(3):242–247).
 * Why centred sums: Σ(yᵢ − R·mᵢ)² with R = ȳ/m̄ equals Syy − 2R·Sym + R²·Smm exactly (the mean term vanishes),
 * and the centred form avoids the cancellation of raw sums Σy² − 2RΣym + R²Σm² when units are near-proportional.
 * Preconditions: finite totals, sizes ≥ 1; `remove` only a pair that was added.
 * @example const u = new UnitMoments(); u.add(10, 2); u.add(30, 4); u.residualSumOfSquares() // 4.444…
 */
export class UnitMoments {
  units = 0;
  meanY = 0;
  meanM = 0;
  syy = 0;
  sym = 0;
  smm = 0;

  add(y: number, m: number): void {
    this.units++;
    const dy = y - this.meanY;
    const dm = m - this.meanM;
    this.meanY += dy / this.units;
    this.meanM += dm / this.units;
    this.syy += dy * (y - this.meanY);
    this.sym += dy * (m - this.meanM);
    this.smm += dm * (m - this.meanM);
  }

  remove(y: number, m: number): void {
    if (this.units <= 1) {
      this.units = 0;
      this.meanY = 0;
      this.meanM = 0;
      this.syy = 0;
      this.sym = 0;
      this.smm = 0;
      return;
    }
    const meanY = (this.units * this.meanY - y) / (this.units - 1);
    const meanM = (this.units * this.meanM - m) / (this.units - 1);
    this.syy -= (y - this.meanY) * (y - meanY);
    this.sym -= (y - meanY) * (m - this.meanM);
    this.smm -= (m - this.meanM) * (m - meanM);
    this.meanY = meanY;
    this.meanM = meanM;
    this.units--;
  }

  /** Σ(yᵢ − R·mᵢ)² with R = ȳ / m̄ (never below 0). */
  residualSumOfSquares(): number {
    if (this.units < 2 || this.meanM === 0) return 0;
    const r = this.meanY / this.meanM;
    const scale = this.syy + r * r * this.smm;
    const ss = this.syy - 2 * r * this.sym + r * r * this.smm;
    // units in exact proportion leave only rounding residue: report it as the zero it is
    return ss > 1e-12 * scale ? ss : 0;
  }
}
