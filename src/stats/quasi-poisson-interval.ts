/**
 * Quasi-Poisson interval (log link) — where the mean count per plot lies when counts are more variable than
 * Poisson: the Poisson standard error of log(mean) inflated by the dispersion φ.
 *
 * Source: McCullagh P, Nelder JA (1989) Generalized Linear Models, 2nd ed., §6.2 (quasi-likelihood,
 * dispersion φ estimated by the Pearson statistic, here s²/m); Wedderburn RWM (1974) Biometrika 61:439–447.
 * Interval m·exp(±z·√(φ/T)) with φ = max(1, s²/m), so never narrower than the Poisson form. One-sided
 * bounds use z₁₋α.
 * Preconditions: plots ≥ 1, total T ≥ 0, dispersion φ ≥ 1, 0 < level < 1.
 * Returns: estimate T/plots and the limits per plot; never negative. At T = 0 the lower limit is 0 and the
 * upper is φ times the exact Poisson upper limit for a zero total (½χ²₍1−α/2; 2₎·φ/plots).
 * Validity: log-scale Wald interval; asymmetric; rough when T is small (below ~10).
 * @example quasiPoissonInterval(40, 20, 3, 0.95, 'two') // 2·exp(±1.96·√(3/40))
 */
import type { Sided } from '../model/types.ts';
import { cachedChiSquareQuantile, cachedNormalQuantile } from './quantile-cache.ts';

export function quasiPoissonInterval(
  total: number,
  plots: number,
  dispersion: number,
  level: number,
  sided: Sided,
): { estimate: number; lower: number; upper: number; se: number } {
  if (!(total >= 0)) throw new RangeError('quasiPoissonInterval requires total >= 0');
  if (!(plots > 0)) throw new RangeError('quasiPoissonInterval requires plots > 0');
  if (!(dispersion >= 1)) throw new RangeError('quasiPoissonInterval requires dispersion >= 1');
  if (!(level > 0 && level < 1)) throw new RangeError('quasiPoissonInterval requires 0 < level < 1');
  const m = total / plots;
  const tail = sided === 'two' ? (1 - level) / 2 : 1 - level;
  if (total === 0) {
    const up =
      sided === 'lower'
        ? Number.POSITIVE_INFINITY
        : ((cachedChiSquareQuantile(1 - tail, 2) / 2) * dispersion) / plots;
    return { estimate: 0, lower: 0, upper: up, se: 0 };
  }
  const z = cachedNormalQuantile(1 - tail);
  const logSe = Math.sqrt(dispersion / total);
  return {
    estimate: m,
    lower: sided === 'upper' ? 0 : m * Math.exp(-z * logSe),
    upper: sided === 'lower' ? Number.POSITIVE_INFINITY : m * Math.exp(z * logSe),
    se: m * logSe,
  };
}
