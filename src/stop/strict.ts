/**
 * The strict stopping rule — valid however often you look.
 *
 * For a field user: choose strict when the answer will be challenged. For measurements and counts with a
 * ± target the app uses a two-stage plan: after the minimum number of observations (the pilot) it computes
 * once how many you need in total, shows that number (the extra ones are the price of certainty), and
 * says "enough" when you reach it — nothing you see on the way can make it stop early. For pass/fail
 * items it shows an interval that is right at every entry at once (a confidence sequence) and stops the
 * first time that interval meets the target; it is wider than the ordinary one, so it costs more items.
 *
 * For an analyst:
 *   measurement / count, target margin d: Stein (1945) two-stage, pilot m = the minimum before a verdict, minimum.ts (extended until the
 *     pilot SD is > 0), N = max(m, ⌊(t₍m−1₎ s_m/d)²⌋ + 1), report x̄_N ± d at n = N
 *     (exact ≥ 1 − α for normal data; stein-two-stage.ts). Counts add the c/m floor (c = 1) to s_m².
 *   measurement / count, target relative r: the same two-stage plan with d = r·x̄_m (approximate); with the
 *     log-scale (Cox) method, N = smallest n with exp(t₍m−1₎·√(s_y²/n + s_y⁴/(2(n−1)))) − 1 ≤ r from the
 *     pilot's log SD (the Cox standard error, Land 1972; Zhou & Gao 1997 — see
 *     src/plan/log-scale-relative-sample-size.ts), and the Cox interval at N is reported.
 *   measurement / count, target precision D (SE/mean): N = max(m, ⌊(s_m/(D·x̄_m))²⌋ + 1).
 *   pass/fail: the beta–binomial mixture confidence sequence (Robbins 1970; Howard et al. 2021), stop at
 *     the first n ≥ m where it meets the target (margin, relative or limit); time-uniform ≥ 1 − α for any
 *     independent items (beta-binomial-confidence-sequence.ts).
 *   A limit target for measurements or counts is not offered under strict (use the limit decision).
 *
 * Preconditions: the shared guards have passed. Returns the verdict and the reported interval.
 * Validity: exact only as stated above; the approximate branches are measured in test/bench/coverage.md.
 *
 * @example strictRule(ctx, { ...setup, rule: 'strict' }).message // "Two-stage plan: 24 in total (…)"
 */
import type { AnalysisSetup } from '../model/types.ts';
import { cachedStudentTQuantile } from '../stats/quantile-cache.ts';
import { betaBinomialConfidenceSequence } from './beta-binomial-confidence-sequence.ts';
import { minimumBeforeVerdict } from './minimum.ts';
import { pilotStats } from './pilot-stats.ts';
import type { Interval, RuleContext, RuleDecision } from './rule-context.ts';
import { decideOn, statusOf } from './status-of.ts';
import { steinTwoStage } from './stein-two-stage.ts';

/** Placeholder interval of a stop-only `keep going` decision (never shown). */
const NO_INTERVAL: Interval = { estimate: Number.NaN, lower: Number.NaN, upper: Number.NaN };

/** Chow–Robbins count-unit floor added to the pilot variance of counts. */
const COUNT_FLOOR = 1;

/** The plan fixed by the pilot: total size, and the pilot figures the reported interval uses. */
export interface TwoStagePlan {
  pilot: number;
  total: number;
  pilotMean: number;
  pilotSd: number;
  quantile: number;
}

/** Computes the two-stage plan from the pilot, or null while the pilot is incomplete or has no spread. */
export function twoStagePlan(values: readonly number[], setup: AnalysisSetup): TwoStagePlan | null {
  const target = setup.target;
  if (!target || target.kind === 'limit') return null;
  const m = Math.max(2, minimumBeforeVerdict(setup));
  const log = setup.kind === 'measurement' && setup.method === 'cox' && target.kind === 'relative';
  // The pilot is the first m values, extended while its spread is zero (Stein needs s_m > 0).
  let k = m;
  let ps: { mean: number; sd: number } | null = null;
  while (k <= values.length) {
    if (log && !((values[k - 1] as number) > 0)) return null;
    const s = pilotStats(values, k, log);
    if (s.sd > 0 || (setup.kind === 'count' && s.mean > 0)) {
      ps = s;
      break;
    }
    k++;
  }
  if (ps === null) return null;
  const sd = setup.kind === 'count' ? Math.sqrt(ps.sd * ps.sd + COUNT_FLOOR / k) : ps.sd;
  const q = setup.sided === 'two' ? 1 - (1 - setup.level) / 2 : setup.level;
  const t = cachedStudentTQuantile(q, k - 1);
  let total: number;
  if (target.kind === 'margin') {
    total = steinTwoStage({
      m: k,
      pilotSd: sd,
      d: target.value,
      level: setup.level,
      sided: setup.sided,
    }).total;
  } else if (target.kind === 'relative' && log) {
    const r = Math.log1p(target.value);
    const s2 = ps.sd * ps.sd;
    // smallest n ≥ k with t·√(s²/n + s⁴/(2(n − 1))) ≤ r: the left side decreases in n, so bisect.
    const ok = (nn: number) => t * Math.sqrt(s2 / nn + (s2 * s2) / (2 * (nn - 1))) <= r;
    let lo = k - 1;
    let hi = k;
    while (!ok(hi) && hi < 1e12) {
      lo = hi;
      hi *= 2;
    }
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (ok(mid)) hi = mid;
      else lo = mid;
    }
    total = hi;
  } else if (target.kind === 'relative') {
    const d = target.value * Math.abs(ps.mean);
    if (!(d > 0)) return null;
    total = steinTwoStage({ m: k, pilotSd: sd, d, level: setup.level, sided: setup.sided }).total;
  } else {
    const denom = target.value * Math.abs(ps.mean);
    if (!(denom > 0)) return null;
    total = Math.max(k, Math.floor((sd / denom) ** 2) + 1);
  }
  return { pilot: k, total, pilotMean: ps.mean, pilotSd: sd, quantile: t };
}

function passFail(ctx: RuleContext, setup: AnalysisSetup, label: string): RuleDecision {
  const nominal = ctx.intervalAt(setup.level, setup.sided);
  // Prefilter: the confidence sequence contains the fixed-n interval at the same level (checked in the
  // tests over a grid), so if the fixed-n interval does not meet the target, neither does the sequence.
  if (ctx.verdictOnly && statusOf(ctx.check(nominal)) === 'keep going')
    return {
      status: 'keep going',
      interval: nominal,
      reportedLevel: setup.level,
      message: 'Not yet.',
      ruleLabel: label,
    };
  const cs = betaBinomialConfidenceSequence(Math.round(ctx.stats.total), ctx.n, setup.level);
  const interval: Interval = {
    estimate: ctx.stats.total / ctx.n,
    lower: setup.sided === 'upper' ? Number.NEGATIVE_INFINITY : cs.lower,
    upper: setup.sided === 'lower' ? Number.POSITIVE_INFINITY : cs.upper,
  };
  return decideOn(ctx, interval, setup.level, label, {
    keepGoing: 'The interval valid at every entry does not meet the target yet.',
    met: 'The interval valid at every entry meets the target.',
  });
}

export function strictRule(ctx: RuleContext, setup: AnalysisSetup): RuleDecision {
  if (ctx.kind === 'pass-fail')
    return passFail(ctx, setup, 'strict (confidence sequence valid at every entry: beta–binomial mixture)');
  const label = 'strict (Stein two-stage: total fixed after the pilot)';
  const nominal = (): Interval => ctx.intervalAt(setup.level, setup.sided);
  if (!setup.target || setup.target.kind === 'limit')
    return {
      status: 'keep going',
      interval: nominal(),
      reportedLevel: setup.level,
      message:
        setup.target?.kind === 'limit'
          ? 'The strict rule does not decide against a limit for this data kind; use the limit decision.'
          : 'No target set.',
      ruleLabel: label,
    };
  const plan = twoStagePlan(ctx.values, setup);
  if ((plan === null || ctx.n < plan.total) && ctx.stopOnly)
    // replay's loop reads only the status of a `keep going` entry (rule-context.ts)
    return {
      status: 'keep going',
      interval: NO_INTERVAL,
      reportedLevel: setup.level,
      message: '',
      ruleLabel: label,
    };
  if (plan === null || ctx.n < plan.total)
    return {
      status: 'keep going',
      interval: nominal(),
      reportedLevel: setup.level,
      message:
        plan === null
          ? 'The pilot is not complete yet (or shows no spread).'
          : `Two-stage plan: ${plan.total} in total (${plan.total - ctx.n} more), fixed after the pilot of ${plan.pilot}.`,
      ruleLabel: label,
    };
  let interval: Interval;
  if (setup.target.kind === 'relative' && setup.method === 'cox') interval = nominal();
  else if (setup.target.kind === 'precision') interval = nominal();
  else {
    const mean = ctx.stats.mean;
    // Stein's interval x̄_N ± d (margin target): coverage ≥ 1 − α for normal data, since
    // t₍m−1₎·s_m/√N ≤ d. For a relative target d = r·x̄_m (approximate).
    const target = setup.target;
    const h = target.kind === 'margin' ? target.value : target.value * Math.abs(plan.pilotMean);
    interval = {
      estimate: mean,
      lower: setup.sided === 'upper' ? Number.NEGATIVE_INFINITY : mean - h,
      upper: setup.sided === 'lower' ? Number.POSITIVE_INFINITY : mean + h,
      se: plan.pilotSd / Math.sqrt(ctx.n),
    };
    if (ctx.kind === 'count' && Number.isFinite(interval.lower)) interval.lower = Math.max(0, interval.lower);
  }
  return {
    status: 'enough',
    interval,
    reportedLevel: setup.level,
    message: `The planned total of ${plan.total} (fixed after the pilot of ${plan.pilot}) is reached.`,
    ruleLabel: label,
  };
}
