/**
 * Poisson random counts.
 *
 * Question answered: "draw one count from a Poisson distribution with mean λ".
 * Sources: for λ < 30, inversion by sequential search (Devroye L (1986) Non-Uniform Random Variate
 * Generation, Springer, ch. X.3, algorithm "inversion by sequential search"); for λ ≥ 30, the transformed
 * rejection method PTRS of Hörmann W (1993) The transformed rejection method for generating Poisson
 * random variables, Insurance: Mathematics and Economics 12:39–45 (constants b = 0.931 + 2.53√λ,
 * a = −0.059 + 0.02483·b, v_r = 0.9277 − 3.6224/(b − 2)).
 *
 * Preconditions: λ ≥ 0 and finite. Returns a non-negative integer.
 *
 * @example
 * poissonVariate(createRng(1), 2); // 0, 1, 2, … with mean 2
 */
import { logGamma } from '../../src/stats/distributions.ts';
import type { Rng } from './xoshiro128.ts';

export function poissonVariate(rng: Rng, lambda: number): number {
  if (!(lambda >= 0) || !Number.isFinite(lambda)) throw new RangeError('poissonVariate requires lambda >= 0');
  if (lambda === 0) return 0;
  if (lambda < 30) {
    let k = 0;
    let p = Math.exp(-lambda);
    let cdf = p;
    const u = rng.next();
    while (u > cdf) {
      k++;
      p *= lambda / k;
      cdf += p;
      if (p < 1e-300 && k > lambda) break;
    }
    return k;
  }
  const slam = Math.sqrt(lambda);
  const loglam = Math.log(lambda);
  const b = 0.931 + 2.53 * slam;
  const a = -0.059 + 0.02483 * b;
  const invalpha = 1.1239 + 1.1328 / (b - 3.4);
  const vr = 0.9277 - 3.6224 / (b - 2);
  for (;;) {
    const u = rng.next() - 0.5;
    const v = rng.next();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + lambda + 0.43);
    if (us >= 0.07 && v <= vr) return k;
    if (k < 0 || (us < 0.013 && v > us)) continue;
    if (
      Math.log(v) + Math.log(invalpha) - Math.log(a / (us * us) + b) <=
      -lambda + k * loglam - logGamma(k + 1)
    )
      return k;
  }
}
