/**
 * Whether counts are significantly more clumped than Poisson — the index-of-dispersion test's yes/no alone,
 * which the count estimator asks after every entry to choose its default interval.
 *
 * Source: the test of dispersion-index-test.ts (Fisher 1950; Krebs 1999): overdispersed when
 * (n − 1)·s²/m > χ²₍1−α, n−1₎. The critical value is bracketed first (chi-square-quantile-bracket.ts,
 * Wilson & Hilferty 1931) and inverted only when the statistic falls inside the bracket, so the answer is
 * the test's own while the per-entry cost stays O(1) (a new n is a new degrees of freedom).
 * Preconditions: n ≥ 2, mean > 0, variance ≥ 0, 0 < alpha < 1 (as dispersionIndexTest).
 * Returns: dispersionIndexTest(n, mean, variance, alpha).overdispersed.
 * @example isOverdispersed(20, 2, 6) // true (statistic 57 > 30.14)
 */
import { chiSquareQuantileBracket } from './chi-square-quantile-bracket.ts';
import { dispersionIndexTest } from './dispersion-index-test.ts';

export function isOverdispersed(n: number, mean: number, variance: number, alpha = 0.05): boolean {
  if (n >= 2 && mean > 0 && variance >= 0 && alpha > 0 && alpha < 1) {
    const statistic = (n - 1) * (variance / mean);
    const b = chiSquareQuantileBracket(1 - alpha, n - 1);
    if (b !== null && statistic > b.hi) return true;
    if (b !== null && statistic < b.lo) return false;
  }
  return dispersionIndexTest(n, mean, variance, alpha).overdispersed;
}
