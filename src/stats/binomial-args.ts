/**
 * Shared argument checks for the binomial interval methods (not a method itself): integers 0 ≤ x ≤ n,
 * n ≥ 1, 0 < level < 1, and the tail probability per side (α/2 two-sided, α one-sided).
 * @example tailProbability(0.95, 'two') // 0.025
 */
import type { Sided } from '../model/types.ts';

export function requireBinomial(name: string, x: number, n: number, level: number): void {
  if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`${name} requires an integer n >= 1`);
  if (!(Number.isInteger(x) && x >= 0 && x <= n))
    throw new RangeError(`${name} requires an integer 0 <= x <= n`);
  if (!(level > 0 && level < 1)) throw new RangeError(`${name} requires 0 < level < 1`);
}

export function tailProbability(level: number, sided: Sided): number {
  return sided === 'two' ? (1 - level) / 2 : 1 - level;
}
