/**
 * Pass/fail random items: 1 (the counted outcome) with probability p, else 0.
 *
 * Question answered: "draw one inspected item with defect rate p".
 * Source: inversion of the Bernoulli distribution (any text, e.g. Devroye 1986, ch. II.2).
 *
 * Preconditions: 0 ≤ p ≤ 1. Returns 0 or 1.
 *
 * @example
 * bernoulliVariate(createRng(1), 0.02); // 1 about once in 50 draws
 */
import type { Rng } from './xoshiro128.ts';

export function bernoulliVariate(rng: Rng, p: number): 0 | 1 {
  if (!(p >= 0 && p <= 1)) throw new RangeError('bernoulliVariate requires 0 <= p <= 1');
  return rng.next() < p ? 1 : 0;
}
