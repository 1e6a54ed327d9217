/**
 * Lognormal random numbers specified by their arithmetic mean and coefficient of variation.
 *
 * Question answered: "draw one concentration-like value with this mean and CV" (the coverage benchmark grid,
 * test/bench/coverage.md: mean 1, CV 0.5, 1, 2).
 * Source: Aitchison J, Brown JAC (1957) The Lognormal Distribution, Cambridge UP, ch. 2: if ln X ~ N(μ, σ²)
 * then E X = exp(μ + σ²/2) and CV² = exp(σ²) − 1, so σ² = ln(1 + CV²) and μ = ln(mean) − σ²/2.
 *
 * Preconditions: mean > 0, cv > 0. Returns a positive number.
 *
 * @example
 * lognormalVariate(createRng(1), 1, 2); // mean 1, CV 2 (σ_log = 1.269)
 */
import { normalVariate } from './normal-variate.ts';
import type { Rng } from './xoshiro128.ts';

export function lognormalVariate(rng: Rng, mean: number, cv: number): number {
  if (!(mean > 0) || !(cv > 0)) throw new RangeError('lognormalVariate requires mean > 0 and cv > 0');
  const s2 = Math.log1p(cv * cv);
  return Math.exp(normalVariate(rng, Math.log(mean) - s2 / 2, Math.sqrt(s2)));
}
