/**
 * Sample size with assurance — the smallest n for which the realised t half-width t₍p, n−1₎·S/√n is ≤ d
 * with probability γ (not just on average), because (n − 1)S²/σ² ~ χ²₍n−1₎.
 *
 * Source: Kupper LL, Hafner KB (1989) How appropriate are popular sample size formulas? The American
 * Statistician 43:101–105: P(t·S/√n ≤ d) = F_χ²₍n−1₎((n − 1)·n·(d/σ)²/t²); choose the smallest n with
 * this ≥ γ. With a population size N the half-width carries the factor √(1 − n/N) (Cochran 1977 ch. 2).
 * Preconditions: sigma > 0, d > 0, 0 < p < 1 (t quantile probability), 0 < gamma < 1; `multiplier`
 * replaces the t quantile (e.g. 1 for an SE target).
 * Returns: an integer n ≥ 2 (capped at population when given).
 * Validity: exact under normal data with σ the true SD.
 * @example kupperHafnerSampleSize(1, 0.5, 0.975, 0.8) // 22 (d/σ = 0.5, 95 %, 80 % assurance)
 */
import { cachedChiSquareQuantile, cachedStudentTQuantile } from '../stats/quantile-cache.ts';

export function kupperHafnerSampleSize(
  sigma: number,
  d: number,
  p: number,
  gamma: number,
  population?: number,
  multiplier?: (df: number) => number,
): number {
  if (!(sigma > 0) || !Number.isFinite(sigma))
    throw new RangeError('kupperHafnerSampleSize requires sigma > 0');
  if (!(d > 0)) throw new RangeError('kupperHafnerSampleSize requires d > 0');
  if (!(gamma > 0 && gamma < 1)) throw new RangeError('kupperHafnerSampleSize requires 0 < gamma < 1');
  const ratio2 = (d / sigma) ** 2;
  const ok = (n: number): boolean => {
    if (population !== undefined && n >= population) return true;
    const q = multiplier ? multiplier(n - 1) : cachedStudentTQuantile(p, n - 1);
    const fpc2 = population === undefined ? 1 : 1 - n / population;
    return ((n - 1) * n * ratio2) / (q * q * fpc2) >= cachedChiSquareQuantile(gamma, n - 1);
  };
  if (ok(2)) return 2;
  let lo = 2;
  let hi = 4;
  while (!ok(hi)) {
    lo = hi;
    hi *= 2;
    if (hi > 1e12) return Number.POSITIVE_INFINITY;
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (ok(mid)) hi = mid;
    else lo = mid;
  }
  return population === undefined ? hi : Math.min(hi, population);
}
