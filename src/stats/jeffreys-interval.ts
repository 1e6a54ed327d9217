/**
 * Jeffreys interval (equal-tailed) — the Bayesian interval with the Jeffreys Beta(½, ½) prior, used as a
 * frequentist interval with good coverage for small n.
 *
 * Source: Brown LD, Cai TT, DasGupta A (2001) Interval estimation for a binomial proportion, Statistical
 * Science 16:101–133, §4.1.2: [Beta⁻¹(α/2; x+½, n−x+½), Beta⁻¹(1−α/2; x+½, n−x+½)], with L = 0 at x = 0 and
 * U = 1 at x = n (their modification). One-sided bounds use α.
 * Preconditions: integers 0 ≤ x ≤ n, n ≥ 1; 1e-7 ≤ tail probability (level ≤ 0.9999998 two-sided).
 * Returns: estimate x/n, lower, upper in [0, 1].
 * Validity: all n; recommended by BCD 2001 for small n together with Wilson.
 * @example jeffreysInterval(81, 263, 0.95, 'two') // { lower: 0.254522, upper: 0.365647 }
 */
import type { Sided } from '../model/types.ts';
import { type BinomialInterval, binomialLimits, binomialTail } from './binomial-args.ts';
import { betaQuantile } from './distributions.ts';

export function jeffreysInterval(x: number, n: number, level: number, sided: Sided): BinomialInterval {
  const tail = binomialTail('jeffreysInterval', x, n, level, sided);
  return binomialLimits(
    x,
    n,
    sided,
    () => betaQuantile(tail, x + 0.5, n - x + 0.5),
    () => betaQuantile(1 - tail, x + 0.5, n - x + 0.5),
  );
}
