/**
 * What the binomial interval methods share (not a method itself): the argument checks (integers
 * 0 ≤ x ≤ n, n ≥ 1, 0 < level < 1), the tail probability per side (α/2 two-sided, α one-sided) or its
 * normal quantile, and the convention for the open side and the boundaries (a one-sided upper bound has
 * lower limit 0, a lower bound has upper limit 1; at x = 0 the lower limit is 0 and at x = n the upper is 1).
 * One place, so a caller mistake reads the same in every method and no method forgets a boundary.
 * @example binomialTail('wilsonInterval', 3, 10, 0.95, 'two') // 0.025
 */
import type { Sided } from '../model/types.ts';
import { cachedNormalQuantile } from './quantile-cache.ts';

/** A binomial interval: the estimate x/n and its limits, proportions in [0, 1]. */
export interface BinomialInterval {
  estimate: number;
  lower: number;
  upper: number;
}

/** Throws `RangeError("<name> requires …")` unless 0 ≤ x ≤ n are integers, n ≥ 1 and 0 < level < 1. */
export function requireBinomial(name: string, x: number, n: number, level: number): void {
  if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`${name} requires an integer n >= 1`);
  if (!(Number.isInteger(x) && x >= 0 && x <= n))
    throw new RangeError(`${name} requires an integer 0 <= x <= n`);
  if (!(level > 0 && level < 1)) throw new RangeError(`${name} requires 0 < level < 1`);
}

/** The arguments checked, then the tail probability of each side. */
export function binomialTail(name: string, x: number, n: number, level: number, sided: Sided): number {
  requireBinomial(name, x, n, level);
  return sided === 'two' ? (1 - level) / 2 : 1 - level;
}

/** The arguments checked, then the standard normal quantile z₁₋tail. */
export function binomialZ(name: string, x: number, n: number, level: number, sided: Sided): number {
  return cachedNormalQuantile(1 - binomialTail(name, x, n, level, sided));
}

/**
 * The interval with the open side and the boundaries set by convention; `lower` and `upper` compute a
 * limit only where one is needed.
 */
export function binomialLimits(
  x: number,
  n: number,
  sided: Sided,
  lower: () => number,
  upper: () => number,
): BinomialInterval {
  return {
    estimate: x / n,
    lower: sided === 'upper' || x === 0 ? 0 : lower(),
    upper: sided === 'lower' || x === n ? 1 : upper(),
  };
}
