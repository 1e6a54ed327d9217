/**
 * The strict rule's price — "how many observations will strict cost me compared with a fixed plan?",
 * for the setup screen.
 *
 * For a field user: strict gives a guarantee that holds however often you look; it needs more
 * observations. This function says how many, before you start.
 *
 * For an analyst:
 *   measurement / count (Stein two-stage, Stein 1945): E(N) ≈ max(m, (t₍m−1₎/z)² · n_plan), the
 *     large-n* ratio of Stein's procedure (Stein 1945; stein-two-stage.ts): 1.3321 at m = 10, 95 %
 *     two-sided; one-sided uses t₍1−α₎/z₁₋α.
 *   pass/fail (confidence sequence, beta-binomial-confidence-sequence.ts): the smallest n whose sequence
 *     at the expected number of outcomes round(n·p) meets a ± d margin (d = the margin, or r·p for a
 *     relative target, or |limit − p| for a limit), found by bisection; p = the planning guess (0.5 when
 *     none is given, the widest case).
 *
 * Preconditions: nPlan ≥ 1 (the fixed-n size the planner computed for this target).
 * Returns: expectedTotal (observations) and factor = expectedTotal / nPlan.
 * Validity: Stein's ratio is asymptotic (exact normal-theory E(N)/n* is 1.35 at n* = 25, m = 10);
 * the pass/fail size ignores the discreteness of the outcomes.
 *
 * @example strictCost({ kind: 'measurement', level: 0.95, sided: 'two', rule: 'strict', min: 10, target: { kind: 'margin', value: 1 } }, 100).factor // 1.3321
 */
import type { AnalysisSetup } from '../model/types.ts';
import { cachedNormalQuantile, cachedStudentTQuantile } from '../stats/quantile-cache.ts';
import { betaBinomialConfidenceSequence } from './beta-binomial-confidence-sequence.ts';
import { minimumBeforeVerdict } from './minimum.ts';

export function strictCost(
  setup: AnalysisSetup,
  nPlan: number,
  guessP = 0.5,
): { expectedTotal: number; factor: number } {
  if (!(nPlan >= 1)) throw new RangeError('strictCost requires nPlan >= 1');
  const m = Math.max(2, minimumBeforeVerdict(setup));
  const q = setup.sided === 'two' ? 1 - (1 - setup.level) / 2 : setup.level;
  if (setup.kind !== 'pass-fail') {
    const ratio = (cachedStudentTQuantile(q, m - 1) / cachedNormalQuantile(q)) ** 2;
    const expectedTotal = Math.max(m, ratio * nPlan);
    return { expectedTotal, factor: expectedTotal / nPlan };
  }
  if (!(guessP > 0 && guessP < 1)) throw new RangeError('strictCost requires 0 < guessP < 1');
  const t = setup.target;
  const d =
    t?.kind === 'margin'
      ? t.value
      : t?.kind === 'relative'
        ? t.value * guessP
        : t?.kind === 'limit'
          ? Math.abs(t.value - guessP)
          : Number.NaN;
  if (!(d > 0)) return { expectedTotal: Number.POSITIVE_INFINITY, factor: Number.POSITIVE_INFINITY };
  const meets = (n: number) => {
    const cs = betaBinomialConfidenceSequence(Math.round(n * guessP), n, setup.level);
    return t?.kind === 'limit'
      ? t.value > guessP
        ? cs.upper < t.value
        : cs.lower > t.value
      : (cs.upper - cs.lower) / 2 <= d;
  };
  let lo = Math.max(1, m);
  let hi = lo;
  while (!meets(hi)) {
    lo = hi;
    hi *= 2;
    if (hi > 1e8) return { expectedTotal: Number.POSITIVE_INFINITY, factor: Number.POSITIVE_INFINITY };
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (meets(mid)) hi = mid;
    else lo = mid;
  }
  return { expectedTotal: hi, factor: hi / nPlan };
}
