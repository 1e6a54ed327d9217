/**
 * Wilson score interval with continuity correction — a slightly more conservative Wilson interval, aiming
 * at minimum rather than average coverage.
 *
 * Source: Newcombe RG (1998) Two-sided confidence intervals for the single proportion: comparison of seven
 * methods, Stat Med 17:857–872, method 4 (after Fleiss 1981):
 * L = [2np̂ + z² − 1 − z√(z² − 2 − 1/n + 4p̂(nq̂ + 1))] / [2(n + z²)],
 * U = [2np̂ + z² + 1 + z√(z² + 2 − 1/n + 4p̂(nq̂ − 1))] / [2(n + z²)]; L = 0 at x = 0, U = 1 at x = n.
 * One-sided bounds use z₁₋α and keep one side.
 * Preconditions: integers 0 ≤ x ≤ n, n ≥ 1; 0 < level < 1.
 * Returns: estimate x/n, lower, upper in [0, 1].
 * Validity: all n; wider than plain Wilson.
 * @example wilsonCcInterval(81, 263, 0.95, 'two') // { lower: 0.2535, upper: 0.3682 }
 */
import type { Sided } from '../model/types.ts';
import { type BinomialInterval, binomialLimits, binomialZ } from './binomial-args.ts';

export function wilsonCcInterval(x: number, n: number, level: number, sided: Sided): BinomialInterval {
  const z = binomialZ('wilsonCcInterval', x, n, level, sided);
  const p = x / n;
  const q = 1 - p;
  const z2 = z * z;
  const den = 2 * (n + z2);
  // The square root of Newcombe's lower limit (sign −1) and of his upper limit (sign +1).
  const root = (sign: 1 | -1) => z * Math.sqrt(Math.max(0, z2 + 2 * sign - 1 / n + 4 * p * (n * q - sign)));
  return binomialLimits(
    x,
    n,
    sided,
    () => Math.max(0, (2 * n * p + z2 - 1 - root(-1)) / den),
    () => Math.min(1, (2 * n * p + z2 + 1 + root(1)) / den),
  );
}
