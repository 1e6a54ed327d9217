/**
 * Student t interval — where the mean of the measured quantity lies, given n measurements.
 *
 * Source: Student (1908) The probable error of a mean, Biometrika 6:1–25; NIST/SEMATECH e-Handbook of
 * Statistical Methods §1.3.5.2 (x̄ ± t₍1−α/2, n−1₎·s/√n); one-sided bounds x̄ ± t₍1−α, n−1₎·s/√n as in
 * USEPA (2009) Unified Guidance ch. 21; finite population correction per Cochran (1977) ch. 2.
 * Preconditions: n ≥ 2, sd ≥ 0, 0 < level < 1; population (if given) ≥ n.
 * Returns: estimate, lower, upper (in the data's units; −∞ / +∞ for the open side of a one-sided
 * bound), the standard error used and the t quantile.
 * Validity: assumes roughly normal means (n large enough for the CLT, or normal data); skewed positive
 * data are better served by the log-scale methods (modified Cox, Land).
 * @example studentTInterval({ n: 10, mean: 5, sd: 1 }, 0.95, 'two') // { lower: 4.2846…, upper: 5.7153… }
 */
import type { Sided } from '../model/types.ts';
import { finitePopulationCorrection } from './finite-population-correction.ts';
import { cachedStudentTQuantile } from './quantile-cache.ts';

export interface MeanInterval {
  estimate: number;
  lower: number;
  upper: number;
  se: number;
  quantile: number;
}

export function studentTInterval(
  stats: { n: number; mean: number; sd: number },
  level: number,
  sided: Sided,
  population?: number,
): MeanInterval {
  const { n, mean, sd } = stats;
  if (!(n >= 2)) throw new RangeError('studentTInterval requires n >= 2');
  if (!(sd >= 0)) throw new RangeError('studentTInterval requires sd >= 0');
  if (!(level > 0 && level < 1)) throw new RangeError('studentTInterval requires 0 < level < 1');
  const se = (sd / Math.sqrt(n)) * finitePopulationCorrection(n, population);
  const p = sided === 'two' ? 1 - (1 - level) / 2 : level;
  const t = cachedStudentTQuantile(p, n - 1);
  const h = t * se;
  return {
    estimate: mean,
    lower: sided === 'upper' ? Number.NEGATIVE_INFINITY : mean - h,
    upper: sided === 'lower' ? Number.POSITIVE_INFINITY : mean + h,
    se,
    quantile: t,
  };
}
