/**
 * Johnson's modified t interval — Student t with its centre moved for the skewness of the values.
 *
 * Source: Johnson NJ (1978) Modified t tests and confidence intervals for asymmetrical populations, JASA
 * 73:536–544: the statistic t₁ = (x̄ − μ + μ̂₃/(6s²n) + μ̂₃(x̄ − μ)²/(3s⁴))/(s/√n), with μ̂₃ the unbiased
 * third central moment n·Σ(x − x̄)³/((n−1)(n−2)). Inverted to first order (the quadratic term dropped, so
 * the interval always exists and is monotone): x̄ + μ̂₃/(6s²n) ± t₍1−α/2, n−1₎·s/√n.
 * Preconditions: n ≥ 3, sd > 0, m3 = Σ(x − x̄)³ (a finite number), 0 < level < 1; population (if given) ≥ n.
 * Returns: estimate x̄, lower, upper (±∞ on the open side of a one-sided bound), se = s/√n (with the
 * finite population correction), the t quantile.
 * Validity: moderately skewed data; for strong skew the first-order shift is too small (the log-scale or
 * gamma intervals do better).
 * @example johnsonTInterval({ n: 10, mean: 5, sd: 2, m3: 90 }, 0.95, 'two') // centre 5 + 10/(6·4·10) = 5.0417
 */
import type { Sided } from '../model/types.ts';
import { finitePopulationCorrection } from './finite-population-correction.ts';
import { cachedStudentTQuantile } from './quantile-cache.ts';

export function johnsonTInterval(
  stats: { n: number; mean: number; sd: number; m3: number },
  level: number,
  sided: Sided,
  population?: number,
): { estimate: number; lower: number; upper: number; se: number; quantile: number; shift: number } {
  const { n, mean, sd, m3 } = stats;
  if (!(n >= 3)) throw new RangeError('johnsonTInterval requires n >= 3');
  if (!(sd > 0)) throw new RangeError('johnsonTInterval requires sd > 0');
  if (!Number.isFinite(m3)) throw new RangeError('johnsonTInterval requires a finite third moment');
  if (!(level > 0 && level < 1)) throw new RangeError('johnsonTInterval requires 0 < level < 1');
  const mu3 = (n * m3) / ((n - 1) * (n - 2));
  const shift = mu3 / (6 * sd * sd * n);
  const se = (sd / Math.sqrt(n)) * finitePopulationCorrection(n, population);
  const t = cachedStudentTQuantile(sided === 'two' ? 1 - (1 - level) / 2 : level, n - 1);
  const centre = mean + shift;
  return {
    estimate: mean,
    lower: sided === 'upper' ? Number.NEGATIVE_INFINITY : centre - t * se,
    upper: sided === 'lower' ? Number.POSITIVE_INFINITY : centre + t * se,
    se,
    quantile: t,
    shift,
  };
}
