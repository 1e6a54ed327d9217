/**
 * Negative binomial random counts with mean m and dispersion k (variance m + m²/k).
 *
 * Question answered: "draw one clumped count per plot" (the coverage benchmark grid,
 * test/bench/coverage.md: mean 2, k = 0.5 and 2).
 * Source: the gamma–Poisson mixture (Greenwood M, Yule GU (1920) J. R. Stat. Soc. 83:255–279; Bliss CI,
 * Fisher RA (1953) Biometrics 9:176–200 for the (m, k) parameterisation): λ ~ Gamma(shape k, scale m/k),
 * X | λ ~ Poisson(λ).
 *
 * Preconditions: mean ≥ 0, k > 0. Returns a non-negative integer.
 *
 * @example
 * negativeBinomialVariate(createRng(1), 2, 0.5); // mean 2, variance 10
 */
import { gammaVariate } from './gamma-variate.ts';
import { poissonVariate } from './poisson-variate.ts';
import type { Rng } from './xoshiro128.ts';

export function negativeBinomialVariate(rng: Rng, mean: number, k: number): number {
  if (!(mean >= 0) || !(k > 0)) throw new RangeError('negativeBinomialVariate requires mean >= 0 and k > 0');
  if (mean === 0) return 0;
  return poissonVariate(rng, (gammaVariate(rng, k) * mean) / k);
}
