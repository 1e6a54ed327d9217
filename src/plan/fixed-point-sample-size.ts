/**
 * Sample size for a target half-width with the t quantile — the smallest n whose t interval (σ taken as
 * known) is no wider than ± d: the continuous fixed point n = (t₍p, n−1₎·σ/d)², with the finite
 * population correction n = n₀/(1 + n₀/N) when a population size N is given.
 *
 * Source: Cochran WG (1977) Sampling Techniques, 3rd ed., §4.4 (n₀ = (tσ/d)², iterated because t depends on
 * n) and §2.12 / eq. 4.1 (n = n₀/(1 + n₀/N)), solved as a continuous fixed point (src/plan/README.md).
 * Preconditions: sigma ≥ 0, d > 0, 0 < p < 1 (p = 1 − α/2 two-sided, 1 − α one-sided); population ≥ 2.
 * Returns: n as a real number ≥ 2 (round up for a count of observations); ≤ population when given.
 * Validity: the t quantile at non-integer df is interpolated (quadratic in 1/df) between integer df, which
 * keeps every quantile a cached lookup.
 * @example fixedPointSampleSize(1, 0.25, 0.975) // 63.8979 (σ = 1, d = 0.25, 95 % two-sided)
 */
import { cachedStudentTQuantile } from '../stats/quantile-cache.ts';

/**
 * t quantile at a real df > 0: exact (cached) at integer df; below df 30, the exact quantile at df rounded
 * to 1/4096 (cached); from df 30 on, quadratic (3-point Lagrange) interpolation in u = 1/df through
 * ⌊df⌋, ⌊df⌋ + 1, ⌊df⌋ + 2.
 */
export function tQuantileAtRealDf(p: number, df: number): number {
  const lo = Math.floor(df);
  if (lo === df) return cachedStudentTQuantile(p, df);
  if (df < 30) return cachedStudentTQuantile(p, Math.round(df * 4096) / 4096);
  const u = 1 / df;
  const u0 = 1 / lo;
  const u1 = 1 / (lo + 1);
  const u2 = 1 / (lo + 2);
  const t0 = cachedStudentTQuantile(p, lo);
  const t1 = cachedStudentTQuantile(p, lo + 1);
  const t2 = cachedStudentTQuantile(p, lo + 2);
  return (
    (t0 * (u - u1) * (u - u2)) / ((u0 - u1) * (u0 - u2)) +
    (t1 * (u - u0) * (u - u2)) / ((u1 - u0) * (u1 - u2)) +
    (t2 * (u - u0) * (u - u1)) / ((u2 - u0) * (u2 - u1))
  );
}

export function fixedPointSampleSize(sigma: number, d: number, p: number, population?: number): number {
  if (!(sigma >= 0) || !Number.isFinite(sigma))
    throw new RangeError('fixedPointSampleSize requires sigma >= 0');
  if (!(d > 0)) throw new RangeError('fixedPointSampleSize requires d > 0');
  if (!(p > 0 && p < 1)) throw new RangeError('fixedPointSampleSize requires 0 < p < 1');
  if (population !== undefined && !(population >= 2))
    throw new RangeError('fixedPointSampleSize requires population >= 2');
  const ratio2 = (sigma / d) ** 2;
  const f = (n: number): number => {
    const t = tQuantileAtRealDf(p, n - 1);
    const n0 = t * t * ratio2;
    return population === undefined ? n0 : n0 / (1 + n0 / population);
  };
  // g(n) = n − f(n) increases in n (f decreases as t falls); find the root on [2, ∞).
  if (2 - f(2) >= 0) return 2;
  let lo = 2;
  let hi = 4;
  while (hi - f(hi) < 0) {
    lo = hi;
    hi *= 2;
    if (hi > 1e12) return Number.POSITIVE_INFINITY;
  }
  // integer bracket first (each step a cached lookup), then bisection inside the unit interval
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (mid - f(mid) < 0) lo = mid;
    else hi = mid;
  }
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    if (mid - f(mid) < 0) lo = mid;
    else hi = mid;
  }
  return population === undefined ? hi : Math.min(hi, population);
}
