/**
 * Wilson score interval — where the true proportion of items with the counted outcome lies, given x of n.
 *
 * Source: Wilson EB (1927) Probable inference, the law of succession, and statistical inference, JASA
 * 22:209–212; Newcombe RG (1998) Stat Med 17:857–872, method 3; NIST/SEMATECH e-Handbook §7.2.4.1:
 * [p̂ + z²/(2n) ± z·√(p̂q̂/n + z²/(4n²))] / (1 + z²/n). One-sided bounds use z₁₋α and keep one side.
 * Preconditions: integers 0 ≤ x ≤ n, n ≥ 1; 0 < level < 1.
 * Returns: estimate x/n, lower, upper in [0, 1] (0 / 1 on the open side of a one-sided bound).
 * Validity: recommended default (Brown, Cai & DasGupta 2001; Agresti & Coull 1998); good coverage for all n.
 * @example wilsonInterval(81, 263, 0.95, 'two') // { lower: 0.2553, upper: 0.3662 }
 */
import type { Sided } from '../model/types.ts';
import { type BinomialInterval, binomialLimits, binomialZ } from './binomial-args.ts';

export function wilsonInterval(x: number, n: number, level: number, sided: Sided): BinomialInterval {
  const z = binomialZ('wilsonInterval', x, n, level, sided);
  const p = x / n;
  const z2 = z * z;
  const centre = (p + z2 / (2 * n)) / (1 + z2 / n);
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / (1 + z2 / n);
  return binomialLimits(
    x,
    n,
    sided,
    () => Math.max(0, centre - half),
    () => Math.min(1, centre + half),
  );
}
