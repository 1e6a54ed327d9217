/**
 * The fixed-sample size with the same error rates as an SPRT — used as the yardstick for the SPRT's
 * truncation ("stop at 3 × the fixed-size equivalent and decide by the midline", src/stop/README.md, "SPRT").
 *
 * Source: the normal-approximation size for a one-sided test of θ₀ against θ₁ with error rates α, β
 * (e.g. Cochran 1977, Sampling Techniques, ch. 4; any power-analysis text), applied to the statistic x of
 * sprt-boundaries.ts: n = ((z₁₋α·sd₀ + z₁₋β·sd₁) / (E₁x − E₀x))².
 *
 * Preconditions: as sprtBoundaries. Returns n (not rounded).
 *
 * @example sprtFixedSize({ family: "poisson", theta0: 1, theta1: 2, alpha: 0.05, beta: 0.1 }) // 11.95
 */
import { cachedNormalQuantile } from '../stats/quantile-cache.ts';
import { type SprtModel, sprtBoundaries } from './sprt-boundaries.ts';

function meanSd(model: SprtModel, theta: number): [number, number] {
  switch (model.family) {
    case 'bernoulli':
      return [theta, Math.sqrt(theta * (1 - theta))];
    case 'poisson':
      return [theta, Math.sqrt(theta)];
    case 'negative-binomial':
      return [theta, Math.sqrt(theta + (theta * theta) / (model.k as number))];
    case 'normal':
      return [theta, model.sigma as number];
    case 'lognormal': {
      const s = model.sigma as number;
      return [Math.log(theta) - (s * s) / 2, s];
    }
  }
}

export function sprtFixedSize(model: SprtModel): number {
  sprtBoundaries(model); // validates
  const [m0, s0] = meanSd(model, model.theta0);
  const [m1, s1] = meanSd(model, model.theta1);
  const za = cachedNormalQuantile(1 - model.alpha);
  const zb = cachedNormalQuantile(1 - model.beta);
  return ((za * s0 + zb * s1) / (m1 - m0)) ** 2;
}
