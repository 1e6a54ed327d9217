/**
 * Maximum-likelihood shape of a gamma distribution — from the mean and the mean of the logarithms only.
 *
 * Source: the likelihood equation ln k − ψ(k) = A, A = ln x̄ − mean(ln x), solved by the rational
 * approximations of Greenwood JA, Durand D (1960) Aids for fitting the gamma distribution by maximum
 * likelihood, Technometrics 2:55–65 (maximum relative error 0.0088 % for 0 < A ≤ 17; beyond, k ≈ 1/A).
 * Preconditions: A > 0 (every value positive and not all equal).
 * Returns: k̂ > 0. Validity: as stated; O(1) from running sums.
 * @example gammaShapeMle(0.2) // 2.6544 (scipy: brentq on ln k − digamma(k) = 0.2 gives 2.6549)
 */
export function gammaShapeMle(a: number): number {
  if (!(a > 0) || !Number.isFinite(a)) throw new RangeError('gammaShapeMle requires A > 0');
  if (a <= 0.5772) return (0.5000876 + 0.1648852 * a - 0.0544274 * a * a) / a;
  if (a <= 17) return (8.898919 + 9.05995 * a + 0.9775373 * a * a) / (a * (17.79728 + 11.968477 * a + a * a));
  return 1 / a;
}
