/**
 * Exact Poisson interval (Garwood) — where the expected total count lies, given an observed total T of a
 * Poisson count; divided by the number of plots it bounds the mean count per plot.
 *
 * Source: Garwood F (1936) Fiducial limits for the Poisson distribution, Biometrika 28:437–442; chi-square
 * form in Ulm K (1990) A simple method to calculate the confidence interval of a standardized mortality
 * ratio, Am J Epidemiol 131:373–375: L = ½χ²₍α/2; 2T₎ (0 at T = 0), U = ½χ²₍1−α/2; 2T+2₎. One-sided bounds
 * use α in place of α/2.
 * Preconditions: T a non-negative integer, 0 < level < 1, plots ≥ 1.
 * Returns: lower and upper limits for the mean per plot (T/plots estimate), in counts per plot.
 * Validity: Poisson counts only (dispersion index ≈ 1); too narrow by about √I when the index I > 1.
 * @example garwoodInterval(10, 1, 0.95, 'two') // { lower: 4.7954, upper: 18.3904 }
 */
import type { Sided } from '../model/types.ts';
import { cachedChiSquareQuantile } from './quantile-cache.ts';

export function garwoodInterval(
  total: number,
  plots: number,
  level: number,
  sided: Sided,
): { estimate: number; lower: number; upper: number } {
  if (!(Number.isInteger(total) && total >= 0))
    throw new RangeError('garwoodInterval requires an integer total >= 0');
  if (!(plots > 0)) throw new RangeError('garwoodInterval requires plots > 0');
  if (!(level > 0 && level < 1)) throw new RangeError('garwoodInterval requires 0 < level < 1');
  const alpha = 1 - level;
  const tail = sided === 'two' ? alpha / 2 : alpha;
  const lowerTotal = sided === 'upper' || total === 0 ? 0 : cachedChiSquareQuantile(tail, 2 * total) / 2;
  const upperTotal =
    sided === 'lower' ? Number.POSITIVE_INFINITY : cachedChiSquareQuantile(1 - tail, 2 * total + 2) / 2;
  return { estimate: total / plots, lower: lowerTotal / plots, upper: upperTotal / plots };
}
