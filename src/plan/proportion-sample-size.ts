/**
 * Sample size for a proportion — how many items give a target half-width (or relative half-width, or
 * SE/p) for the proportion with the counted outcome, with the finite lot correction.
 *
 * Source: Cochran WG (1977) Sampling Techniques, 3rd ed., eq. 4.2: n₀ = z²·p(1−p)/d², and eq. 4.3 for a
 * lot of N items: n = n₀/(1 + (n₀ − 1)/N). Relative target r: d = r·p. Precision D = SE/p: n₀ = (1−p)/(p·D²).
 * Zero-acceptance (no counted outcome expected, show p < L): n = ln α / ln(1 − L), from the exact
 * one-sided bound at x = 0, 1 − α^{1/n} (Hanley JA, Lippman-Hand A (1983) If nothing goes wrong, is
 * everything all right? JAMA 249:1743–1745).
 * Preconditions: 0 < p < 1 (use the Agresti–Coull centre p̃, never 0), target value > 0, 0 < z.
 * Returns: n as a real number (round up), ≤ N when given.
 * Validity: the normal-approximation planning formula; the Wilson interval needs slightly fewer items.
 * @example proportionSampleSize({ p: 0.5, target: 'margin', value: 0.05, z: 1.959964 }) // 384.15
 */
export function proportionSampleSize(args: {
  p: number;
  target: 'margin' | 'relative' | 'precision';
  value: number;
  z: number;
  population?: number;
}): number {
  const { p, target, value, z, population } = args;
  if (!(p > 0 && p < 1)) throw new RangeError('proportionSampleSize requires 0 < p < 1');
  if (!(value > 0)) throw new RangeError('proportionSampleSize requires a target value > 0');
  const n0 =
    target === 'precision'
      ? (1 - p) / (p * value * value)
      : (z * z * p * (1 - p)) / (target === 'margin' ? value * value : (value * p) ** 2);
  return population === undefined ? n0 : n0 / (1 + (n0 - 1) / population);
}

/** Items needed to show p < limit at confidence 1 − α when none has the counted outcome. */
export function zeroAcceptanceSampleSize(limit: number, alpha: number): number {
  if (!(limit > 0 && limit < 1)) throw new RangeError('zeroAcceptanceSampleSize requires 0 < limit < 1');
  if (!(alpha > 0 && alpha < 1)) throw new RangeError('zeroAcceptanceSampleSize requires 0 < alpha < 1');
  return Math.log(alpha) / Math.log1p(-limit);
}
