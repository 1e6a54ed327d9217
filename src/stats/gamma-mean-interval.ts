/**
 * Gamma-based interval for a mean — where the mean of positive, right-skewed values lies when they look
 * gamma-shaped (their logarithms skewed to the left) rather than lognormal.
 *
 * Source: for a gamma sample with shape k, 2n·k·x̄/μ follows χ² with 2nk degrees of freedom, so
 * [2nk·x̄/χ²₍1−α/2₎(2nk), 2nk·x̄/χ²₍α/2₎(2nk)] holds μ; with k estimated this is the approximate interval of
 * Grice JV, Bain LJ (1980) Inferences concerning the mean of the gamma distribution, JASA 75:929–933.
 * Shape: the maximum-likelihood k̂ (gamma-shape-mle.ts, Greenwood & Durand 1960), then the small-sample
 * bias correction
 * k* = (n − 3)·k̂/n + 2/(3n) (Anderson CW, Ray WD (1975) Improved maximum likelihood estimators for the
 * gamma distribution, Communications in Statistics 4:437–448; given from memory).
 * Preconditions: n ≥ 4, every value > 0 (logMean is the mean of their logarithms), 0 < level < 1.
 * Returns: estimate x̄, lower, upper (±∞ on the open side of a one-sided bound), se = x̄/√(n·k*), shape k*.
 * Validity: gamma-like data; for lognormal-like data it is too narrow on the right (use the log-scale
 * methods), for near-symmetric data Student t is as good and cheaper.
 * @example gammaMeanInterval({ n: 20, mean: 2, logMean: Math.log(2) - 0.2 }, 0.95, 'two') // shape ≈ 2.45
 */
import type { Sided } from '../model/types.ts';
import { chiSquareQuantile } from './distributions.ts';
import { gammaShapeMle } from './gamma-shape-mle.ts';

export function gammaMeanInterval(
  stats: { n: number; mean: number; logMean: number },
  level: number,
  sided: Sided,
): { estimate: number; lower: number; upper: number; se: number; shape: number } {
  const { n, mean, logMean } = stats;
  if (!(Number.isInteger(n) && n >= 4)) throw new RangeError('gammaMeanInterval requires n >= 4');
  if (!(mean > 0)) throw new RangeError('gammaMeanInterval requires a positive mean');
  if (!(level > 0 && level < 1)) throw new RangeError('gammaMeanInterval requires 0 < level < 1');
  // A ≥ 0 by Jensen's inequality; rounding may leave a tiny negative for near-constant values
  const a = Math.log(mean) - logMean;
  if (!(a > 1e-12)) throw new RangeError('gammaMeanInterval requires values with spread');
  const k = Math.max(((n - 3) * gammaShapeMle(a)) / n + 2 / (3 * n), 1e-3);
  const df = 2 * n * k;
  const alpha = 1 - level;
  const lowTail = sided === 'two' ? alpha / 2 : alpha;
  const lower =
    sided === 'upper' ? Number.NEGATIVE_INFINITY : (df * mean) / chiSquareQuantile(1 - lowTail, df);
  const upper = sided === 'lower' ? Number.POSITIVE_INFINITY : (df * mean) / chiSquareQuantile(lowTail, df);
  return { estimate: mean, lower, upper, se: mean / Math.sqrt(n * k), shape: k };
}
