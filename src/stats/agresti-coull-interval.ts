/**
 * Agresti–Coull interval — the Wald interval recentred on the "add z²/2 successes and failures" estimate;
 * its centre p̃ is also the planning value for sample sizes (never 0).
 *
 * Source: Agresti A, Coull BA (1998) Approximate is better than "exact" for interval estimation of binomial
 * proportions, The American Statistician 52:119–126: ñ = n + z², p̃ = (x + z²/2)/ñ, p̃ ± z√(p̃(1−p̃)/ñ),
 * clipped to [0, 1]. One-sided bounds use z₁₋α.
 * Preconditions: integers 0 ≤ x ≤ n, n ≥ 1; 0 < level < 1.
 * Returns: estimate x/n, lower, upper in [0, 1], the centre p̃ and its standard error.
 * Validity: recommended by Brown, Cai & DasGupta (2001) for n ≥ 40.
 * @example agrestiCoullInterval(81, 263, 0.95, 'two') // { lower: 0.255221, upper: 0.366277 }
 */
import type { Sided } from '../model/types.ts';
import { type BinomialInterval, binomialZ } from './binomial-args.ts';

export function agrestiCoullInterval(
  x: number,
  n: number,
  level: number,
  sided: Sided,
): BinomialInterval & { centre: number; se: number } {
  const z = binomialZ('agrestiCoullInterval', x, n, level, sided);
  const nt = n + z * z;
  const centre = (x + (z * z) / 2) / nt;
  const se = Math.sqrt((centre * (1 - centre)) / nt);
  return {
    estimate: x / n,
    lower: sided === 'upper' ? 0 : Math.max(0, centre - z * se),
    upper: sided === 'lower' ? 1 : Math.min(1, centre + z * se),
    centre,
    se,
  };
}
