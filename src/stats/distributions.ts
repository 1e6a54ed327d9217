/**
 * The typed facade over jstat — the only file in the project that imports it.
 *
 * Why a facade: jstat returns sentinels (NaN, Infinity) instead of errors, rounds some results, and is
 * inaccurate in far tails (measured against scipy: src/stats/README.md, "jstat's accuracy"). Every function
 * here checks its domain and throws `RangeError("<name> requires <condition>")` for caller mistakes, clips
 * probabilities to [1e-12, 1 − 1e-12] before quantiles, switches Student t to the normal above df 1e4
 * (jstat's t cdf drifts by 3.5e-2 at df 1e6), and computes discrete cdfs from the regularised incomplete
 * gamma/beta functions (jstat's own Poisson/binomial pdf overflow above ~150 / ~1000).
 */
/// <reference path="./jstat.d.ts" />
import { jStat } from 'jstat';

const P_MIN = 1e-12;
const P_MAX = 1 - 1e-12;
/**
 * Above this many degrees of freedom Student t is replaced by the normal: the quantiles differ by < 1e-4
 * relative for 0.01 ≤ p ≤ 0.99 (1.3e-4 at p = 0.001, 2.6e-4 at p = 1e-10; test/core/stats), far below what a
 * field interval can resolve, while jstat's own t cdf drifts by 3.5e-2 at df 1e6.
 */
const T_NORMAL_SWITCH_DF = 1e4;

function requireProbability(name: string, p: number): number {
  if (!Number.isFinite(p) || p <= 0 || p >= 1) throw new RangeError(`${name} requires 0 < p < 1`);
  return Math.min(P_MAX, Math.max(P_MIN, p));
}
function requirePositive(name: string, what: string, x: number): void {
  if (!Number.isFinite(x) || x <= 0) throw new RangeError(`${name} requires ${what} > 0`);
}

/** Standard normal p-quantile Φ⁻¹(p). */
export function normalQuantile(p: number): number {
  return jStat.normal.inv(requireProbability('normalQuantile', p), 0, 1);
}
/** Standard normal cdf Φ(x). */
export function normalCdf(x: number): number {
  if (Number.isNaN(x)) throw new RangeError('normalCdf requires a number');
  return jStat.normal.cdf(x, 0, 1);
}
/** Student t p-quantile with df degrees of freedom (left-tail convention: studentTQuantile(0.975, 9) ≈ 2.262). */
export function studentTQuantile(p: number, df: number): number {
  const q = requireProbability('studentTQuantile', p);
  requirePositive('studentTQuantile', 'df', df);
  if (df > T_NORMAL_SWITCH_DF) return normalQuantile(q);
  return jStat.studentt.inv(q, df);
}
/** Student t cdf. */
export function studentTCdf(x: number, df: number): number {
  requirePositive('studentTCdf', 'df', df);
  if (Number.isNaN(x)) throw new RangeError('studentTCdf requires a number');
  if (df > T_NORMAL_SWITCH_DF) return normalCdf(x);
  return jStat.studentt.cdf(x, df);
}
/**
 * Above this many degrees of freedom the chi-square quantile is Wilson & Hilferty's cube-root normal
 * approximation (1931, "The distribution of chi-square", PNAS 17:684–688): ν(1 − 2/(9ν) + z·√(2/(9ν)))³.
 * Measured against scipy.stats.chi2.ppf, its error is below 1e-7 of the distance to the mean at ν ≥ 2e6 for
 * 0.005 ≤ p ≤ 0.999, falling as 1/ν; jstat's iterative inversion there takes seconds per call and drifts by
 * a quarter of the interval's half-width at ν = 2e10 (the exact Poisson interval for totals of 1e10).
 */
const CHI_SQUARE_CUBE_ROOT_DF = 2e6;

/** Chi-square p-quantile (left tail: chiSquareQuantile(0.05, 1) = 0.00393). */
export function chiSquareQuantile(p: number, df: number): number {
  const q = requireProbability('chiSquareQuantile', p);
  requirePositive('chiSquareQuantile', 'df', df);
  if (df > CHI_SQUARE_CUBE_ROOT_DF) {
    const c = 2 / (9 * df);
    return df * (1 - c + normalQuantile(q) * Math.sqrt(c)) ** 3;
  }
  return jStat.chisquare.inv(q, df);
}
/** Chi-square cdf, from the regularised lower incomplete gamma. */
export function chiSquareCdf(x: number, df: number): number {
  requirePositive('chiSquareCdf', 'df', df);
  if (Number.isNaN(x)) throw new RangeError('chiSquareCdf requires a number');
  if (x <= 0) return 0;
  if (x === Number.POSITIVE_INFINITY) return 1;
  return jStat.lowRegGamma(df / 2, x / 2);
}
/** Gamma(shape, scale 1) p-quantile. */
export function gammaQuantile(p: number, shape: number): number {
  const q = requireProbability('gammaQuantile', p);
  requirePositive('gammaQuantile', 'shape', shape);
  return jStat.gamma.inv(q, shape, 1);
}
/**
 * Beta(a, b) p-quantile. Guarded because jstat's ibetainv is wrong by orders of magnitude for p ≤ 1e-8 with
 * small a (src/stats/README.md, "jstat's accuracy"); the interval methods never need p beyond 1e-6 at
 * confidence ≤ 0.999999.
 */
export function betaQuantile(p: number, a: number, b: number): number {
  const q = requireProbability('betaQuantile', p);
  requirePositive('betaQuantile', 'a', a);
  requirePositive('betaQuantile', 'b', b);
  if (q < 1e-7 || q > 1 - 1e-7) throw new RangeError('betaQuantile requires 1e-7 <= p <= 1 - 1e-7');
  return jStat.beta.inv(q, a, b);
}
/** Regularised incomplete beta I_x(a, b) = Beta(a, b) cdf at x. */
export function betaCdf(x: number, a: number, b: number): number {
  requirePositive('betaCdf', 'a', a);
  requirePositive('betaCdf', 'b', b);
  if (Number.isNaN(x)) throw new RangeError('betaCdf requires a number');
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  return jStat.ibeta(x, a, b);
}
/** Natural log of the gamma function. */
export function logGamma(x: number): number {
  requirePositive('logGamma', 'x', x);
  return jStat.gammaln(x);
}
/** P(X ≤ k) for X ~ Poisson(λ), as Q(k+1, λ) = 1 − P(k+1, λ); safe for large totals (no factorials). */
export function poissonCdf(k: number, lambda: number): number {
  if (!Number.isInteger(k)) throw new RangeError('poissonCdf requires an integer k');
  if (!Number.isFinite(lambda) || lambda < 0) throw new RangeError('poissonCdf requires lambda >= 0');
  if (k < 0) return 0;
  if (lambda === 0) return 1;
  return 1 - jStat.lowRegGamma(k + 1, lambda);
}
/** P(X ≤ k) for X ~ Binomial(n, p), via the incomplete beta: I_{1−p}(n−k, k+1). */
export function binomialCdf(k: number, n: number, p: number): number {
  if (!Number.isInteger(k) || !Number.isInteger(n) || n < 0)
    throw new RangeError('binomialCdf requires integers k and n >= 0');
  if (!(p >= 0 && p <= 1)) throw new RangeError('binomialCdf requires 0 <= p <= 1');
  if (k < 0) return 0;
  if (k >= n) return 1;
  if (p === 0) return 1;
  if (p === 1) return 0;
  return jStat.ibeta(1 - p, n - k, k + 1);
}
/** log C(n, k) via log-gamma (no overflow). */
export function logChoose(n: number, k: number): number {
  if (!Number.isInteger(n) || !Number.isInteger(k) || k < 0 || k > n)
    throw new RangeError('logChoose requires integers 0 <= k <= n');
  return logGamma(n + 1) - logGamma(k + 1) - logGamma(n - k + 1);
}
