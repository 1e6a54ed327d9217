/**
 * Replay one recorded or simulated sequence through a stopping rule — "where would the rule have stopped,
 * and what would it have reported there?" (`sure-enough replay`, the coverage benchmark).
 *
 * The same running assessment as every other surface (running.ts), minus what only the screen needs: at each
 * entry only the rule's verdict is asked for (no projection, labels or details; the rule may skip its
 * reported interval while it says `keep going`); at the stopping entry (or the last one) the full assessment
 * is computed once, so the reported figures are exactly the app's. A test checks that the stopping entry is
 * the first at which the full assessment gives a verdict other than `keep going`.
 *
 * Preconditions: values are valid for the data kind (the caller validates input); setup as for assess.
 * Returns: stoppedAt (1-based n, or null when the rule never stopped) and the estimate, bounds and verdict
 * reported there (at the end of the sequence when it never stopped). Bounds are null when infinite
 * (one-sided) or unavailable.
 * Cost: O(1) per entry for the data kinds (O(min) for rules that read the pilot); designs take the full
 * verdict-only pipeline per entry (see subject.ts for their costs).
 *
 * @example replaySequence([9.8, 10.1, …], setup) // { stoppedAt: 23, estimate: 10.02, lower: 9.6, upper: 10.4, verdict: 'enough' }
 */

import type { Interval } from '../model/interval.ts';
import type { AnalysisSetup, Sided, Target, VerdictStatus } from '../model/types.ts';
import { garwoodBracket } from '../stats/garwood-poisson-bracket.ts';
import { landInnerBounds } from '../stats/land-inner-bounds.ts';
import { decide, minimumBeforeVerdict, type RuleContext } from '../stop/index.ts';
import { chosenMethod } from './pipeline.ts';
import { RunningAssessment } from './running.ts';
import { kindEstimator } from './subject.ts';
import { checkTarget, effectiveSided } from './target.ts';

export interface ReplayResult {
  stoppedAt: number | null;
  estimate: number | null;
  lower: number | null;
  upper: number | null;
  verdict: VerdictStatus;
  /** Confidence level of the reported interval (the rule's reported level). */
  level: number;
}

/**
 * A memo of pass/fail decisions shared across sequences with the same setup: every pass/fail rule
 * (standard, naive, strict, sprt) depends only on (counted outcomes, items), so the decision at (x, n)
 * is computed once. Create one per setup with `new Map()`.
 */
export type PassFailMemo = Map<number, boolean>;

export function replaySequence(
  values: readonly number[],
  setup: AnalysisSetup,
  memo?: PassFailMemo,
): ReplayResult {
  const running = new RunningAssessment(setup);
  const state = running.entryState;
  const summary = state.summary;
  const target = setup.target;
  const min = minimumBeforeVerdict(setup);
  const sidedSetups: Record<string, AnalysisSetup> = {};
  let stoppedAt: number | null = null;
  // one context for the whole sequence, updated per entry (no per-entry closures or objects)
  let sided: Sided = setup.sided;
  const stats: RuleContext['stats'] = { total: 0, mean: 0, sd: 0, logMean: null, logSd: null };
  const ctx: RuleContext = {
    kind: setup.kind,
    n: 0,
    intervalAt: () => {
      throw new RangeError('replaySequence: no interval yet');
    },
    check: (iv) => checkTarget(target as Target, iv, sided),
    stats,
    values: state.values,
    verdictOnly: true,
    stopOnly: true,
  };
  // Intervals inside the exact one, found without solving for its limits, settle most `keep going` entries
  // (rule-context.ts, innerIntervalAt): exact Poisson counts (each entry brings a new total, so new degrees
  // of freedom: garwood-poisson-bracket.ts) and Land's method (a new n and s_y: land-inner-bounds.ts).
  // The figures are computed exactly as the estimators compute them (estimators/count.ts, measurement.ts).
  let plots = 0;
  let total = 0;
  let poissonSe = 0;
  const poissonInner = (level: number, s: Sided, tier: number): Interval | null => {
    const b = tier === 0 ? garwoodBracket(total, plots, level, s) : null;
    return b === null ? null : { estimate: total / plots, lower: b.lowerIn, upper: b.upperIn, se: poissonSe };
  };
  const landInner = (level: number, s: Sided, tier: number): Interval | null => {
    const sd = summary.logSd;
    const b = landInnerBounds(plots, summary.logMean, sd, level, s, tier);
    if (b === null) return null;
    const s2 = sd * sd;
    const estimate = Math.exp(summary.logMean + s2 / 2);
    const se = estimate * Math.sqrt(s2 / plots + (s2 * s2) / (2 * (plots - 1)));
    return { estimate, lower: b.lower, upper: b.upper, se };
  };
  const noInner = (): null => null;
  for (let i = 0; i < values.length; i++) {
    running.addValue(values[i] as number);
    const n = state.n;
    if (target === undefined) continue;
    if (state.design) {
      // design-based estimates: the full pipeline, verdict only
      if (running.assessWith({ projection: false }).verdict.status !== 'keep going') {
        stoppedAt = n;
        break;
      }
      continue;
    }
    if (n < min) continue;
    const key = memo !== undefined && setup.kind === 'pass-fail' ? summary.total * 4194304 + n : -1;
    if (key >= 0) {
      const hit = memo?.get(key);
      if (hit === false) continue;
      if (hit === true) {
        stoppedAt = n;
        break;
      }
    }
    const estimator = kindEstimator(state, setup);
    if (estimator.guard !== null || estimator.intervalAt === null) {
      if (key >= 0) memo?.set(key, false);
      continue;
    }
    sided = effectiveSided(setup, estimator.estimate);
    // as the pipeline does: the rule sees the method the data chose (one setup object per side and method)
    const chosen = setup.rule === 'sprt' ? undefined : chosenMethod(setup, estimator.method);
    const setupKey = chosen === undefined ? sided : `${sided}|${chosen}`;
    let s = sidedSetups[setupKey];
    if (s === undefined) {
      s = sided === setup.sided && chosen === undefined ? setup : { ...setup, sided };
      if (chosen !== undefined) s.method = chosen;
      sidedSetups[setupKey] = s;
    }
    ctx.n = n;
    ctx.methodChosen = chosen !== undefined;
    ctx.intervalAt = estimator.intervalAt;
    plots = n;
    if (estimator.method === 'poisson-exact') {
      total = Math.round(summary.total);
      poissonSe = Math.sqrt(summary.mean / n);
      ctx.innerIntervalAt = poissonInner;
    } else if (estimator.method === 'land') ctx.innerIntervalAt = landInner;
    else ctx.innerIntervalAt = noInner;
    stats.total = summary.total;
    stats.mean = summary.mean;
    stats.sd = summary.sd;
    stats.logMean = summary.positive === n ? summary.logMean : null;
    stats.logSd = summary.positive === n && n >= 2 ? summary.logSd : null;
    const stops = decide(ctx, s).status !== 'keep going';
    if (key >= 0) memo?.set(key, stops);
    if (stops) {
      stoppedAt = n;
      break;
    }
  }
  const a = running.assessWith({ projection: false });
  return {
    stoppedAt,
    estimate: a.estimate,
    lower: a.lower,
    upper: a.upper,
    verdict: a.verdict.status,
    level: a.level,
  };
}
