/**
 * Bounds on the exact Poisson (Garwood) interval without inverting the chi-square distribution — an inner
 * interval that the exact one contains and an outer one that contains it. A check that is monotone in the
 * interval's width (does it meet a ± target, does it clear a limit) is settled when both give the same
 * answer; only otherwise is the exact interval needed (replay's stop-only loop, src/stop/).
 *
 * Source: the Garwood (1936) limits in chi-square form (garwood-poisson-interval.ts), each chi-square
 * quantile bracketed by chi-square-quantile-bracket.ts (Wilson & Hilferty 1931 with a measured error bound).
 * Preconditions: as garwoodInterval (integer total ≥ 0, plots > 0, 0 < level < 1).
 * Returns: the inner limits (lowerIn ≥ exact lower, upperIn ≤ exact upper) and the outer ones (lowerOut ≤
 * exact lower, upperOut ≥ exact upper), in counts per plot; 0 / +∞ on an open side, as garwoodInterval. Null
 * when a tail probability is outside the bracket's range (the caller computes the exact interval).
 * @example garwoodBracket(2000, 1000, 0.95, 'two') // lowerOut ≤ 1.9148… ≤ lowerIn, upperIn ≤ 2.0890… ≤ upperOut
 */
import type { Sided } from '../model/types.ts';
import { chiSquareQuantileBracket } from './chi-square-quantile-bracket.ts';

export interface PoissonBracket {
  lowerIn: number;
  lowerOut: number;
  upperIn: number;
  upperOut: number;
}

export function garwoodBracket(
  total: number,
  plots: number,
  level: number,
  sided: Sided,
): PoissonBracket | null {
  const tail = sided === 'two' ? (1 - level) / 2 : 1 - level;
  const estimate = total / plots;
  let lowerIn = 0;
  let lowerOut = 0;
  if (sided !== 'upper' && total > 0) {
    const b = chiSquareQuantileBracket(tail, 2 * total);
    if (b === null) return null;
    // the same operations as garwoodInterval (quantile / 2 / plots), each monotone, so the order holds
    lowerIn = Math.min(estimate, b.hi / 2 / plots);
    lowerOut = b.lo / 2 / plots;
  }
  let upperIn = Number.POSITIVE_INFINITY;
  let upperOut = Number.POSITIVE_INFINITY;
  if (sided !== 'lower') {
    const b = chiSquareQuantileBracket(1 - tail, 2 * total + 2);
    if (b === null) return null;
    upperIn = Math.max(estimate, b.lo / 2 / plots);
    upperOut = b.hi / 2 / plots;
  }
  return { lowerIn, lowerOut, upperIn, upperOut };
}
