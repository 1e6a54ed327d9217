/**
 * "How many more" for measurements — the likely total n for an absolute half-width d, with its 10th–90th
 * percentile range and the 80 %-assurance figure.
 *
 * Source (src/plan/README.md): point n = fixed point of n = (t₍n−1₎·σ̂/d)² (Cochran 1977 §4.4); σ̂ and the
 * range from the chi-square confidence distribution of σ (σ_q = s·√(ν/χ²₍1−q, ν₎), q = 0.5 for the likely
 * figure, 0.1 and 0.9 for the range), ν = n − 1, or Box's ν for heavy-tailed data when the excess kurtosis is
 * given (box-variance-df.ts); assured n from Kupper & Hafner (1989, Am Stat 43:101–105) with γ = 0.8, at
 * σ's 80th percentile rather than at s, so that the uncertainty of σ itself is allowed for as well (the
 * upper confidence limit of a pilot SD: Browne RH (1995) On the use of a pilot sample for sample size
 * determination, Statistics in Medicine 14:1933–1940).
 * Preconditions: n ≥ 2, s > 0, d > 0, 0 < p < 1; `multiplier` (optional) replaces the t quantile by a fixed
 * factor (SE targets: 1; Chebyshev: √(1/α − 1)).
 * Returns: totals (likely, low, high, assured) as real numbers (likely/low/high) and an integer (assured).
 * Validity: normal-ish data; with a finite population every figure is ≤ N.
 * @example projectMeasurement({ n: 8, s: 2, d: 1, p: 0.975 }) // likely 19.4, low 11.4, high 40.4, assured 37
 */
import { boxVarianceDf } from './box-variance-df.ts';
import { sigmaQuantile } from './chi-square-sigma-limits.ts';
import { fixedPointSampleSize } from './fixed-point-sample-size.ts';
import { kupperHafnerSampleSize } from './kupper-hafner-assurance.ts';

export function projectMeasurement(args: {
  n: number;
  s: number;
  d: number;
  p: number;
  population?: number;
  multiplier?: number;
  /** Excess kurtosis of the values (Box's ν for the σ distribution); absent: normal (ν = n − 1). */
  kurtosis?: number | null;
}): { likely: number; low: number; high: number; assured: number } {
  const { n, s, d, p, population, multiplier } = args;
  const df = args.kurtosis === undefined || args.kurtosis === null ? n - 1 : boxVarianceDf(n, args.kurtosis);
  if (!(n >= 2)) throw new RangeError('projectMeasurement requires n >= 2');
  if (!(s > 0)) throw new RangeError('projectMeasurement requires s > 0');
  if (!(d > 0)) throw new RangeError('projectMeasurement requires d > 0');
  const size = (sigma: number): number => {
    if (multiplier === undefined) return fixedPointSampleSize(sigma, d, p, population);
    const n0 = ((multiplier * sigma) / d) ** 2;
    return population === undefined ? n0 : n0 / (1 + n0 / population);
  };
  const likely = size(sigmaQuantile(s, n, 0.5, df));
  const low = size(sigmaQuantile(s, n, 0.1, df));
  const high = size(sigmaQuantile(s, n, 0.9, df));
  const upper = sigmaQuantile(s, n, 0.8, df);
  const assured =
    multiplier === undefined
      ? kupperHafnerSampleSize(upper, d, p, 0.8, population)
      : kupperHafnerSampleSize(upper, d, p, 0.8, population, () => multiplier);
  return { likely, low, high, assured };
}
