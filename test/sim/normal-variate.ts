/**
 * Normal random numbers — Marsaglia's polar method.
 *
 * Question answered: "draw one value from a normal distribution with this mean and standard deviation".
 * Source: Marsaglia G, Bray TA (1964) A convenient method for generating normal variables, SIAM Review
 * 6(3):260–264 (the polar form of the Box–Muller transform). The second value of each accepted pair is
 * discarded so that the function is stateless (a replicate's stream depends only on its Rng).
 *
 * Preconditions: sd ≥ 0. Returns a number in the data's units.
 * Validity limits: exact in distribution up to floating point; tails limited by the 32-bit uniforms
 * (|z| ≲ 6.6).
 *
 * @example
 * normalVariate(createRng(1), 10, 1); // a draw from N(10, 1)
 */
import type { Rng } from './xoshiro128.ts';

export function normalVariate(rng: Rng, mean = 0, sd = 1): number {
  if (!(sd >= 0)) throw new RangeError('normalVariate requires sd >= 0');
  for (;;) {
    const u = 2 * rng.next() - 1;
    const v = 2 * rng.next() - 1;
    const s = u * u + v * v;
    if (s > 0 && s < 1) return mean + sd * u * Math.sqrt((-2 * Math.log(s)) / s);
  }
}
