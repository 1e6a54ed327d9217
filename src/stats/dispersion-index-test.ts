/**
 * Index-of-dispersion test — are the counts more variable than Poisson (clumped)?
 *
 * Source: Fisher RA (1950) The significance of deviations from expectation in a Poisson series,
 * Biometrics 6:17–24; Krebs CJ (1999) Ecological Methodology, 2nd ed., ch. 6 (spatial pattern):
 * I = s²/m and (n − 1)·I ~ χ²₍n−1₎ under a Poisson pattern.
 * Preconditions: n ≥ 2, mean > 0, variance ≥ 0, 0 < alpha < 1.
 * Returns: the index I, the statistic (n − 1)I, the upper critical value χ²₍1−α, n−1₎ and whether the counts
 * are significantly overdispersed (one-sided, upper tail). Used only to choose the default interval, not
 * as a gate.
 * Validity: the chi-square approximation needs a mean above about 1 (Krebs: n > 5 plots).
 * @example dispersionIndexTest(20, 2, 6) // index 3, statistic 57 > 30.14 → overdispersed
 */
import { cachedChiSquareQuantile } from './quantile-cache.ts';

export function dispersionIndexTest(
  n: number,
  mean: number,
  variance: number,
  alpha = 0.05,
): { index: number; statistic: number; critical: number; overdispersed: boolean } {
  if (!(n >= 2)) throw new RangeError('dispersionIndexTest requires n >= 2');
  if (!(mean > 0)) throw new RangeError('dispersionIndexTest requires mean > 0');
  if (!(variance >= 0)) throw new RangeError('dispersionIndexTest requires variance >= 0');
  const index = variance / mean;
  const statistic = (n - 1) * index;
  const critical = cachedChiSquareQuantile(1 - alpha, n - 1);
  return { index, statistic, critical, overdispersed: statistic > critical };
}
