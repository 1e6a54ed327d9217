/**
 * Confidence limits for σ from the chi-square distribution — how large or small the true SD plausibly is
 * given a sample SD s from n observations; used to turn one projection into a likely range.
 *
 * Source: (n − 1)S²/σ² ~ χ²₍n−1₎ for normal data (e.g. NIST/SEMATECH e-Handbook §1.3.5.8; Cochran 1977
 * §4.7 uses the same distribution to bound σ when planning). σ_q = s·√((n − 1)/χ²₍1−q, n−1₎) is the
 * q-quantile of the confidence distribution of σ.
 * With heavy-tailed data the degrees of freedom may be given as Box's ν (box-variance-df.ts) instead of n − 1.
 * Preconditions: n ≥ 2, s ≥ 0, 0 < q < 1, df > 0.
 * Returns: σ_q in the data's units (σ_0.1 < s < σ_0.9 roughly).
 * Validity: normal data; for skewed data the range is too narrow.
 * @example sigmaQuantile(2, 8, 0.9) // 3.14 (s = 2, n = 8: the 90th percentile of σ)
 */
import { cachedChiSquareQuantile } from '../stats/quantile-cache.ts';

export function sigmaQuantile(s: number, n: number, q: number, df = n - 1): number {
  if (!(n >= 2)) throw new RangeError('sigmaQuantile requires n >= 2');
  if (!(s >= 0)) throw new RangeError('sigmaQuantile requires s >= 0');
  if (!(q > 0 && q < 1)) throw new RangeError('sigmaQuantile requires 0 < q < 1');
  if (!(df > 0)) throw new RangeError('sigmaQuantile requires df > 0');
  return s * Math.sqrt(df / cachedChiSquareQuantile(1 - q, df));
}
