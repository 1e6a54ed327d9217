/**
 * "How many more" for a decision against a limit — the predictive distribution of the total at which the
 * one-sided bound will clear the limit, on either side.
 *
 * A decision against a limit ends when the running mean's bound clears L: |x̄_N − L| > c·b/√N (c the quantile,
 * b the spread the bound uses). How far the crew still has to go depends above all on how far the true mean
 * sits from the limit, which the data know only to about ± s/√n. Projecting from the observed distance alone
 * (the n at which the bound would clear if the mean stayed where it is) left that out: its 10–90 % range held
 * the entries actually needed in only 20–50 % of simulated studies (test/bench/calibration.md).
 *
 * Here the running mean after N entries is predicted from the data (flat prior on the mean, spread taken as
 * known): x̄_N ~ N(x̄_n, σ²·(N − n)/(n·N)), the predictive distribution of a future mean behind Spiegelhalter
 * DJ, Freedman LS, Blackburn PR (1986) Monitoring clinical trials: conditional or predictive power? Controlled
 * Clinical Trials 7:8–17. The chance that the bound clears L at N on either side is then
 *   F(N) = Φ((D − c_N·b/√N)/τ_N) + Φ((−D − c_N·b/√N)/τ_N),  D = x̄_n − L,  τ_N = σ·√((N − n)/(n·N)),
 * which rises from 0 at N = n (the bound has not cleared) to 1. The likely total is the median of F, the range
 * its 10th–90th percentiles and the assured figure its 80th percentile. F counts a decision at N only, not one
 * reached earlier and kept; the benchmark (test/bench/calibration.md) measures how well its percentiles hold.
 *
 * Preconditions: n ≥ 2, σ > 0, b > 0, c(N) > 0. Returns totals (real numbers, ≥ n; +∞ when the percentile is
 * not reached by 10⁹ entries); every figure ≤ population when one is given.
 * @example projectLimitDecision({ n: 10, distance: 0.5, spread: 1, multiplier: (N) => tQuantile(0.95, N − 1) })
 * // likely 13, low 11, high 143, assured 39 (test/fixtures/limit-decision.json)
 */
import { normalCdf } from '../stats/distributions.ts';

export interface LimitDecisionProjection {
  likely: number;
  low: number;
  high: number;
  assured: number;
}

const FAR = 1e9;

export interface LimitDecisionArgs {
  n: number;
  /** x̄ − L: the estimate's signed distance from the limit. */
  distance: number;
  /** σ: the per-entry spread behind the future mean. */
  spread: number;
  /** b: the per-entry spread in the bound (default σ; Wilson's bound uses the limit's √(L(1 − L))). */
  boundSpread?: number;
  /** c(N): the bound's quantile at a total of N entries. */
  multiplier: (total: number) => number;
  population?: number;
}

/** F(N): the predictive chance that the bound has cleared the limit, on either side, at a total of N entries. */
export function limitDecisionChance(args: LimitDecisionArgs, total: number): number {
  const { n, distance: d, spread: sigma } = args;
  const b = args.boundSpread ?? sigma;
  const tau = sigma * Math.sqrt((total - n) / (n * total));
  const clear = (args.multiplier(total) * b) / Math.sqrt(total);
  if (!(tau > 0)) return Math.abs(d) > clear ? 1 : 0;
  return normalCdf((d - clear) / tau) + normalCdf((-d - clear) / tau);
}

export function projectLimitDecision(args: LimitDecisionArgs): LimitDecisionProjection {
  const { n, spread: sigma, population } = args;
  if (!(n >= 2)) throw new RangeError('projectLimitDecision requires n >= 2');
  if (!(sigma > 0) || !((args.boundSpread ?? sigma) > 0))
    throw new RangeError('projectLimitDecision requires spreads > 0');
  const percentile = (q: number): number => {
    // smallest whole total with F ≥ q: a doubling bracket, then bisection on whole entries (F rises with N)
    let lo = n;
    let hi = n + 1;
    while (limitDecisionChance(args, hi) < q) {
      lo = hi;
      hi = n + 2 * (hi - n);
      if (hi > FAR) return Number.POSITIVE_INFINITY;
    }
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (limitDecisionChance(args, mid) < q) lo = mid;
      else hi = mid;
    }
    return population === undefined ? hi : Math.min(hi, population);
  };
  return { likely: percentile(0.5), low: percentile(0.1), high: percentile(0.9), assured: percentile(0.8) };
}
