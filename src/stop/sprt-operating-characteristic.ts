/**
 * The SPRT's operating characteristic and expected number of observations — for the setup screen:
 * "if the true rate were θ, how often would the test say 'below limit', and how many entries would it
 * take on average?"
 *
 * Source: Wald A (1947) Sequential Analysis, Wiley, ch. 3 and 4 (also any quality-control text, e.g.
 * Montgomery, Introduction to Statistical Quality Control). Let Z = q·(x − s) be one observation's
 * log-likelihood ratio (see sprt-boundaries.ts) and K(t) = ln E_θ e^{t·x} the cumulant function of the
 * statistic x under θ. The nonzero h with E_θ e^{h·Z} = 1, i.e. K(h·q) = h·q·s, gives
 *   L(θ) = (A^h − 1)/(A^h − B^h)     (probability of accepting, "below limit"),
 *   ASN(θ) = [L·ln B + (1 − L)·ln A] / E_θ Z,
 * and at E_θ Z = 0 (h → 0): L = ln A/(ln A − ln B), ASN = −ln A·ln B / E_θ Z².
 * Cumulant functions: Bernoulli ln(1 − θ + θeᵗ); Poisson θ(eᵗ − 1); negative binomial
 * −k·ln(1 − (θ/k)(eᵗ − 1)); normal μt + σ²t²/2 (μ = θ, or ln θ − σ²/2 on the log scale).
 *
 * Preconditions: as sprtBoundaries; θ > 0 (and < 1 for pass/fail).
 * Returns: acceptProbability = L(θ) and asn = the expected number of observations (untruncated; capped
 * at maxN when given, which slightly overstates it).
 * Validity: Wald's approximations ignore the overshoot of the boundaries: L(θ₀) ≈ 1 − α and
 * L(θ₁) ≈ β exactly by construction; the real test is a little more conservative.
 *
 * @example sprtOperatingCharacteristic({ family: 'bernoulli', theta0: 0.01, theta1: 0.06, alpha: 0.05, beta: 0.1 }, 0.01)
 * // { acceptProbability: 0.95, asn: ≈ 30.6 }
 */
import { type SprtModel, sprtBoundaries } from './sprt-boundaries.ts';

function cumulant(
  model: SprtModel,
  theta: number,
): { K: (t: number) => number; mean: number; variance: number } {
  switch (model.family) {
    case 'bernoulli':
      return {
        K: (t) => Math.log(1 - theta + theta * Math.exp(t)),
        mean: theta,
        variance: theta * (1 - theta),
      };
    case 'poisson':
      return { K: (t) => theta * Math.expm1(t), mean: theta, variance: theta };
    case 'negative-binomial': {
      const k = model.k as number;
      return {
        K: (t) => {
          const u = 1 - (theta / k) * Math.expm1(t);
          return u > 0 ? -k * Math.log(u) : Number.POSITIVE_INFINITY;
        },
        mean: theta,
        variance: theta + (theta * theta) / k,
      };
    }
    case 'normal':
    case 'lognormal': {
      const v = (model.sigma as number) ** 2;
      const mu = model.family === 'normal' ? theta : Math.log(theta) - v / 2;
      return { K: (t) => mu * t + (v * t * t) / 2, mean: mu, variance: v };
    }
  }
}

export function sprtOperatingCharacteristic(
  model: SprtModel,
  theta: number,
  maxN?: number,
): { acceptProbability: number; asn: number } {
  if (!(theta > 0) || (model.family === 'bernoulli' && !(theta < 1)))
    throw new RangeError('sprtOperatingCharacteristic requires theta inside the family range');
  const { q, slope } = sprtBoundaries(model);
  const lnA = Math.log((1 - model.beta) / model.alpha);
  const lnB = Math.log(model.beta / (1 - model.alpha));
  const { K, mean, variance } = cumulant(model, theta);
  const ez = q * (mean - slope);
  const cap = (asn: number) => (maxN !== undefined ? Math.min(asn, maxN) : asn);
  const g = (h: number) => K(h * q) - h * q * slope;
  const ez2 = q * q * (variance + (mean - slope) ** 2);
  if (Math.abs(ez) < 1e-9 * Math.sqrt(ez2)) {
    return { acceptProbability: lnA / (lnA - lnB), asn: cap((-lnA * lnB) / ez2) };
  }
  // g is convex with g(0) = 0 and g'(0) = E Z; the other root lies on the side opposite to the sign of E Z.
  const dir = ez < 0 ? 1 : -1;
  let lo = 0;
  let hi = dir * 1e-3;
  while (g(hi) < 0) {
    lo = hi;
    hi *= 2;
    if (Math.abs(hi) > 1e6) break;
  }
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (g(mid) < 0) lo = mid;
    else hi = mid;
    if (Math.abs(hi - lo) < 1e-14 * Math.max(1, Math.abs(hi))) break;
  }
  const h = (lo + hi) / 2;
  // L = (A^h − 1)/(A^h − B^h), computed in logs to avoid overflow.
  const a = h * lnA;
  const b = h * lnB;
  let L: number;
  if (a > 0) L = (1 - Math.exp(-a)) / (1 - Math.exp(b - a));
  else L = Math.expm1(a) / (Math.exp(a) - Math.exp(b));
  L = Math.min(1, Math.max(0, L));
  return { acceptProbability: L, asn: cap((L * lnB + (1 - L) * lnA) / ez) };
}
