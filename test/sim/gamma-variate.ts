/**
 * Gamma random numbers (shape k, scale 1) — Marsaglia & Tsang's squeeze method.
 *
 * Question answered: "draw one Gamma(shape, 1) value" (used for negative binomial counts as a
 * gamma–Poisson mixture).
 * Source: Marsaglia G, Tsang WW (2000) A simple method for generating gamma variables, ACM Trans. Math.
 * Softw. 26(3):363–372 — d = k − 1/3, c = 1/√(9d), accept v = (1 + c·z)³ when
 * ln u < z²/2 + d − d·v + d·ln v; for k < 1 draw with k + 1 and multiply by u^{1/k} (their §6).
 *
 * Preconditions: shape > 0. Returns a positive number.
 *
 * @example
 * gammaVariate(createRng(1), 0.5); // mean 0.5, variance 0.5
 */
import { normalVariate } from './normal-variate.ts';
import type { Rng } from './xoshiro128.ts';

export function gammaVariate(rng: Rng, shape: number): number {
  if (!(shape > 0) || !Number.isFinite(shape)) throw new RangeError('gammaVariate requires shape > 0');
  if (shape < 1) return gammaVariate(rng, shape + 1) * rng.next() ** (1 / shape);
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  for (;;) {
    let z: number;
    let v: number;
    do {
      z = normalVariate(rng);
      v = 1 + c * z;
    } while (v <= 0);
    v = v * v * v;
    const u = rng.next();
    if (u < 1 - 0.0331 * z * z * z * z) return d * v;
    if (Math.log(u) < 0.5 * z * z + d * (1 - v + Math.log(v))) return d * v;
  }
}
