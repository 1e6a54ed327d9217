/**
 * Wald's sequential probability ratio test (SPRT) — the decision lines "below the limit / above the
 * limit / keep going", for pass/fail items, counts and (log-scale) measurements.
 *
 * For a field user: you give the rate or mean you can live with (the lower end of the indifference
 * zone, θ₀), the one you must not miss (the upper end, θ₁), and the two error risks: α = chance of
 * calling an acceptable site "above" and β = chance of calling an unacceptable site "below". After every
 * entry the running total is compared with two parallel lines: at or under the lower line the answer is
 * "below limit", at or over the upper line "above limit", between them "keep going".
 *
 * Source: Wald A (1947) Sequential Analysis, Wiley (A = (1 − β)/α, B = β/(1 − α); continue while
 * ln B < Λₙ < ln A). With Sₙ the running sum of the statistic x (the 0/1 outcome, the count, the value or
 * its logarithm) the log-likelihood ratio is Λₙ = q·(Sₙ − s·n), so
 *   accept ("below") when Sₙ ≤ −h₀ + s·n,  reject ("above") when Sₙ ≥ h₁ + s·n,
 *   h₀ = ln((1 − α)/β)/q,  h₁ = ln((1 − β)/α)/q,
 * with, per family:
 *   Bernoulli: g₁ = ln(p₁/p₀), g₂ = ln((1 − p₀)/(1 − p₁)), q = g₁ + g₂, s = g₂/q
 *     (Montgomery, Introduction to Statistical Quality Control, sequential sampling plans);
 *   Poisson: q = ln(λ₁/λ₀), s = (λ₁ − λ₀)/q;
 *   negative binomial, common k (Waters 1955, Forest Sci. 1:68–79):
 *     q = ln[m₁(m₀ + k)/(m₀(m₁ + k))], s = k·ln((m₁ + k)/(m₀ + k))/q;
 *   normal, σ known: q = (μ₁ − μ₀)/σ², s = (μ₀ + μ₁)/2; on the log scale for lognormal measurements
 *     whose arithmetic means are θᵢ: μᵢ = ln θᵢ − σ²/2 (σ = SD of the logs, from the pilot).
 *
 * Preconditions: 0 < α, β < 1 with α + β < 1; θ₀ < θ₁ in the family's range (0 < p < 1; λ, m > 0;
 * k > 0; σ > 0).
 * Returns: h₀, h₁ (in units of the statistic), the slope s and q (log-likelihood per unit of statistic).
 * Validity: the realised error rates are at most about α/(1 − β) and β/(1 − α) (Wald) and usually below
 * nominal because of overshoot; σ estimated from a pilot makes the normal version approximate.
 *
 * @example
 * sprtBoundaries({ family: 'bernoulli', theta0: 0.01, theta1: 0.06, alpha: 0.05, beta: 0.1 })
 * // { h0: 1.2211…, h1: 1.5678…, slope: 0.02811…, q: … }
 */
export type SprtFamily = 'bernoulli' | 'poisson' | 'negative-binomial' | 'normal' | 'lognormal';

export interface SprtModel {
  family: SprtFamily;
  /** Acceptable value (lower end of the indifference zone): rate, mean count, or arithmetic mean. */
  theta0: number;
  /** Unacceptable value (upper end of the indifference zone). */
  theta1: number;
  alpha: number;
  beta: number;
  /** Negative binomial k (family 'negative-binomial'). */
  k?: number;
  /** σ of the values ('normal') or of their logarithms ('lognormal'). */
  sigma?: number;
  /**
   * A larger σ used only for the spacing of the lines (q), e.g. an upper confidence bound on σ from a
   * pilot; the midline keeps `sigma`. Defaults to `sigma`.
   */
  sigmaForSpacing?: number;
}

export interface SprtLines {
  /** Accept ("below") line: Sₙ ≤ −h0 + slope·n. */
  h0: number;
  /** Reject ("above") line: Sₙ ≥ h1 + slope·n. */
  h1: number;
  slope: number;
  /** Log-likelihood ratio per unit of the statistic: Λₙ = q·(Sₙ − slope·n). */
  q: number;
}

export function sprtBoundaries(model: SprtModel): SprtLines {
  const { family, theta0: t0, theta1: t1, alpha, beta } = model;
  if (!(alpha > 0 && alpha < 1 && beta > 0 && beta < 1 && alpha + beta < 1))
    throw new RangeError('sprtBoundaries requires 0 < alpha, beta < 1 and alpha + beta < 1');
  if (!(t0 < t1) || !(t0 > 0)) throw new RangeError('sprtBoundaries requires 0 < theta0 < theta1');
  let q: number;
  let slope: number;
  switch (family) {
    case 'bernoulli': {
      if (!(t1 < 1)) throw new RangeError('sprtBoundaries requires theta1 < 1 for pass/fail');
      const g1 = Math.log(t1 / t0);
      const g2 = Math.log((1 - t0) / (1 - t1));
      q = g1 + g2;
      slope = g2 / q;
      break;
    }
    case 'poisson':
      q = Math.log(t1 / t0);
      slope = (t1 - t0) / q;
      break;
    case 'negative-binomial': {
      const k = model.k;
      if (!(k !== undefined && k > 0))
        throw new RangeError('sprtBoundaries requires k > 0 for negative binomial');
      q = Math.log((t1 * (t0 + k)) / (t0 * (t1 + k)));
      slope = (k * Math.log((t1 + k) / (t0 + k))) / q;
      break;
    }
    case 'normal':
    case 'lognormal': {
      const sigma = model.sigma;
      if (!(sigma !== undefined && sigma > 0)) throw new RangeError('sprtBoundaries requires sigma > 0');
      const v = sigma * sigma;
      const spacing = model.sigmaForSpacing ?? sigma;
      const mu0 = family === 'normal' ? t0 : Math.log(t0) - v / 2;
      const mu1 = family === 'normal' ? t1 : Math.log(t1) - v / 2;
      q = (mu1 - mu0) / (spacing * spacing);
      slope = (mu0 + mu1) / 2;
      break;
    }
  }
  return { h0: Math.log((1 - alpha) / beta) / q, h1: Math.log((1 - beta) / alpha) / q, slope, q };
}
