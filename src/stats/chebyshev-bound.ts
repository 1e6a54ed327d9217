/**
 * Chebyshev bound for a mean — a distribution-free-in-intent confidence bound for the mean of strongly
 * skewed data whose distribution is unclear.
 *
 * Source: Singh A, Singh AK, Engelhardt M (1997) The lognormal distribution in environmental applications,
 * EPA/600/R-97/006; USEPA (2002) Calculating upper confidence limits for exposure point concentrations at
 * hazardous waste sites, OSWER 9285.6-10: UCL = x̄ + √(1/α − 1)·s/√n (one-sided, Cantelli's form of
 * Chebyshev's inequality applied to x̄). Two-sided: x̄ ± (1/√α)·s/√n (Chebyshev's inequality).
 * Preconditions: n ≥ 2, sd ≥ 0, 0 < level < 1; population (if given) ≥ n for the finite population correction.
 * Returns: estimate, lower, upper in data units (±∞ on the open side of a one-sided bound), se, multiplier.
 * Validity: conservative for moderate skew; not guaranteed when s itself is badly underestimated
 * (very skewed data, small n).
 * @example chebyshevBound({ n: 20, mean: 10, sd: 5 }, 0.95, 'upper').upper // 10 + 4.3589·5/√20 = 14.873
 */
import type { Sided } from '../model/types.ts';
import { finitePopulationCorrection } from './finite-population-correction.ts';

export function chebyshevBound(
  stats: { n: number; mean: number; sd: number },
  level: number,
  sided: Sided,
  population?: number,
): { estimate: number; lower: number; upper: number; se: number; quantile: number } {
  const { n, mean, sd } = stats;
  if (!(n >= 2)) throw new RangeError('chebyshevBound requires n >= 2');
  if (!(sd >= 0)) throw new RangeError('chebyshevBound requires sd >= 0');
  if (!(level > 0 && level < 1)) throw new RangeError('chebyshevBound requires 0 < level < 1');
  const alpha = 1 - level;
  const k = sided === 'two' ? 1 / Math.sqrt(alpha) : Math.sqrt(1 / alpha - 1);
  const se = (sd / Math.sqrt(n)) * finitePopulationCorrection(n, population);
  return {
    estimate: mean,
    lower: sided === 'upper' ? Number.NEGATIVE_INFINITY : mean - k * se,
    upper: sided === 'lower' ? Number.POSITIVE_INFINITY : mean + k * se,
    se,
    quantile: k,
  };
}
