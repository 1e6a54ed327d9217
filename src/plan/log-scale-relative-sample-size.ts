/**
 * Sample size for a relative half-width on the log scale — how many positive, skewed observations give a
 * modified Cox upper limit within a factor (1 + r) of the estimated arithmetic mean.
 *
 * Source: the Cox standard error (Land 1972; Zhou & Gao 1997, Stat Med
 * 16:783–790) with Olsson's (2005) t quantile: smallest n with h(t₍p, n−1₎·√(s_y²/n + s_y⁴/(2(n−1)))) ≤ r, h = sinh
 * for the two-sided half-width (U − L)/2 relative to the estimate, eˣ − 1 for the upper side, 1 − e⁻ˣ for the lower.
 * (Two-sided studies used eˣ − 1 until 2026-12: the upper side alone, which over-projected relative targets on
 * lognormal data by up to 2.2 times, test/bench/calibration.md.)
 * Preconditions: s_y ≥ 0 (SD of ln x), r > 0, 0 < p < 1.
 * Returns: n as a real number ≥ 2 (the continuous root; round up).
 * Validity: lognormal-like data; the t quantile at non-integer df is interpolated in 1/df.
 * @example logScaleRelativeSampleSize(1, 0.25, 0.975) // ≈ 118.5
 */
import { tQuantileAtRealDf } from './fixed-point-sample-size.ts';

export function logScaleRelativeSampleSize(
  sy: number,
  r: number,
  p: number,
  sided: 'two' | 'upper' | 'lower' = 'upper',
): number {
  if (!(sy >= 0) || !Number.isFinite(sy))
    throw new RangeError('logScaleRelativeSampleSize requires s_y >= 0');
  if (!(r > 0)) throw new RangeError('logScaleRelativeSampleSize requires r > 0');
  if (!(p > 0 && p < 1)) throw new RangeError('logScaleRelativeSampleSize requires 0 < p < 1');
  // the bound on t·SE that the interval's relative half-width allows: exp(centre ± x) around the estimate
  // exp(centre) gives (U − L)/2 = estimate·sinh(x) two-sided, U − estimate = estimate·(eˣ − 1) above and
  // estimate − L = estimate·(1 − e⁻ˣ) below — the half-widths the target is checked on (src/assess/target.ts)
  const target =
    sided === 'two'
      ? Math.asinh(r)
      : sided === 'lower'
        ? r < 1
          ? -Math.log1p(-r)
          : Infinity
        : Math.log1p(r);
  const s2 = sy * sy;
  const excess = (n: number): number =>
    tQuantileAtRealDf(p, n - 1) * Math.sqrt(s2 / n + (s2 * s2) / (2 * (n - 1))) - target;
  if (excess(2) <= 0) return 2;
  let lo = 2;
  let hi = 4;
  while (excess(hi) > 0) {
    lo = hi;
    hi *= 2;
    if (hi > 1e12) return Number.POSITIVE_INFINITY;
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (excess(mid) > 0) lo = mid;
    else hi = mid;
  }
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    if (excess(mid) > 0) lo = mid;
    else hi = mid;
  }
  return hi;
}
