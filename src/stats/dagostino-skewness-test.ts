/**
 * D'Agostino's skewness test — is a sample skewed, judged by its moment skewness √b₁ and its size?
 *
 * Source: D'Agostino RB (1970) Transformation to normality of the null distribution of g₁, Biometrika
 * 57:679–681; in the form of D'Agostino RB, Belanger A, D'Agostino RB Jr (1990) A suggestion for using
 * powerful and informative tests of normality, The American Statistician 44:316–321, eq. (3)–(4):
 *   Y = √b₁·√((n+1)(n+3)/(6(n−2))), β₂ = 3(n² + 27n − 70)(n+1)(n+3)/((n−2)(n+5)(n+7)(n+9)),
 *   W² = −1 + √(2(β₂ − 1)), δ = 1/√(ln W), α = √(2/(W² − 1)), Z = δ·ln(Y/α + √((Y/α)² + 1)),
 * Z approximately standard normal for normal data (positive: skewed to the right).
 * Preconditions: n ≥ 8 (the approximation is stated for n ≥ 8), √b₁ = m₃/m₂^{3/2} with the divisor-n
 * moments (a finite number).
 * Returns: Z. Validity: a test of the third moment only; O(1) from running moments.
 * @example dagostinoSkewnessZ(20, 1) // 1.98 (scipy.stats.skewtest gives the same Z for √b₁ = 1, n = 20)
 */
export function dagostinoSkewnessZ(n: number, sqrtB1: number): number {
  if (!(Number.isInteger(n) && n >= 8)) throw new RangeError('dagostinoSkewnessZ requires n >= 8');
  if (!Number.isFinite(sqrtB1)) throw new RangeError('dagostinoSkewnessZ requires a finite skewness');
  const y = sqrtB1 * Math.sqrt(((n + 1) * (n + 3)) / (6 * (n - 2)));
  const beta2 = (3 * (n * n + 27 * n - 70) * (n + 1) * (n + 3)) / ((n - 2) * (n + 5) * (n + 7) * (n + 9));
  const w2 = -1 + Math.sqrt(2 * (beta2 - 1));
  const delta = 1 / Math.sqrt(0.5 * Math.log(w2));
  const alpha = Math.sqrt(2 / (w2 - 1));
  const u = y / alpha;
  return delta * Math.log(u + Math.sqrt(u * u + 1));
}
