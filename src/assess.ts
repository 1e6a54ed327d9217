/**
 * Assessment of a study's observations: the interval that fits the data kind, the shared guards, the
 * stopping rule's verdict (src/stop/index.ts decides; this file only hands it a RuleContext), and "how
 * many more" (METHODS §3, §3.6, §3.7).
 *
 * Per entry the app keeps a RunningSummary (O(1) add/remove) and calls `assessSummary`; every quantile on
 * that path is a cached lookup, so one call costs microseconds in steady state (Land's method, chosen only
 * on request, does a 1-D quadrature per new (n, s_y) instead). `assess(points, setup)` is the batch form
 * the command line uses; it replays the entries so the smoothed projection equals the app's.
 *
 * Guards, before any rule: `keep going` before `setup.min` observations, with one distinct value, with zero
 * spread (measurements and counts), and with all-zero counts. Pass/fail items: while every item so far has
 * the same outcome, a margin, relative or precision target is never `enough` (reason `one-distinct-value`,
 * with a message pointing to a limit target), but a limit target may still be decided: no defect in 300
 * items is the zero-acceptance demonstration of METHODS §3.3 (`below limit` by the exact bound
 * 1 − α^(1/n)); the minimum still applies.
 *
 * Smoothing of "how many more": once n ≥ min, the projected total is clamped to 0.5–1.5 × the previous
 * entry's raw (unclamped) projected total when the previous assessment is passed in (`options.previous`);
 * `details` carries `moreSmoothed` and the raw figure `moreRawLikely` whenever the clamp acted. Because
 * the clamp looks one entry back only, the result after n entries needs just the assessments at n − 1
 * and n (O(1), whatever n is).
 */

import { assessDesign, usesDesign } from './design/index.ts';
import type { AnalysisSetup, Assessment, More, Point, Sided, Target, Verdict } from './model/types.ts';
import { countModel } from './stats/kinds/count.ts';
import type { KindModel } from './stats/kinds/kind-model.ts';
import { measurementModel } from './stats/kinds/measurement.ts';
import { passFailModel } from './stats/kinds/pass-fail.ts';
import { RunningSummary } from './stats/running-summary.ts';
import { decide, type Interval, type RuleContext, type TargetCheck } from './stop/index.ts';

export interface AssessOptions {
  /** The assessment after the previous entry, for smoothing "how many more". */
  previous?: Assessment | null;
  /**
   * Skip "how many more" and let the rule skip its expensive reported interval while the verdict is
   * `keep going` (replay, benchmark: only the verdict matters). Default true.
   */
  projection?: boolean;
  /**
   * Compute "how many more" (default true). False keeps everything else exact, reported interval included:
   * the app's running chart needs only the interval at its sampled points, and the projection (root
   * finding for the assured figure) is the costly part of an assessment.
   */
  more?: boolean;
}

/** Default minimum number of observations before any verdict other than `keep going`. */
export const DEFAULT_MIN = 10;
const SMOOTH_FACTOR = 1.5;

/** Half-width of an interval in the direction(s) it bounds. */
export function halfWidth(interval: Interval, sided: Sided): number {
  if (sided === 'upper') return interval.upper - interval.estimate;
  if (sided === 'lower') return interval.estimate - interval.lower;
  return (interval.upper - interval.lower) / 2;
}

/** Whether an interval meets a target (see Target in src/model/types.ts). */
export function checkTarget(target: Target, interval: Interval, sided: Sided): TargetCheck {
  switch (target.kind) {
    case 'margin':
      return halfWidth(interval, sided) <= target.value ? 'met' : 'not-met';
    case 'relative':
      return interval.estimate > 0 && halfWidth(interval, sided) <= target.value * interval.estimate
        ? 'met'
        : 'not-met';
    case 'precision':
      return interval.se !== undefined && interval.se > 0 && interval.estimate > 0
        ? interval.se / interval.estimate <= target.value
          ? 'met'
          : 'not-met'
        : 'not-met';
    case 'limit':
      if (interval.upper < target.value) return 'below';
      if (interval.lower > target.value) return 'above';
      return 'undecided';
  }
}

/** The data kind's model (interval, guards, projection) over a running summary. */
export function modelFor(summary: RunningSummary, setup: AnalysisSetup): KindModel {
  switch (setup.kind) {
    case 'measurement':
      return measurementModel(summary, setup);
    case 'count':
      return countModel(summary, setup);
    case 'pass-fail':
      return passFailModel(summary, setup);
  }
}

function finiteOrNull(x: number | undefined): number | null {
  return x !== undefined && Number.isFinite(x) ? x : null;
}

function validateSetup(setup: AnalysisSetup): void {
  if (!(setup.level > 0 && setup.level < 1)) throw new RangeError('assess requires 0 < level < 1');
  if (!(Number.isInteger(setup.min) && setup.min >= 1))
    throw new RangeError('assess requires an integer min >= 1');
  if (setup.population !== undefined && !(Number.isInteger(setup.population) && setup.population >= 1))
    throw new RangeError('assess requires an integer population >= 1');
  if (setup.plotArea !== undefined && !(setup.plotArea > 0))
    throw new RangeError('assess requires plotArea > 0');
  if (setup.target !== undefined) {
    const t = setup.target;
    if (!Number.isFinite(t.value)) throw new RangeError('assess requires a finite target value');
    if (t.kind !== 'limit' && !(t.value > 0)) throw new RangeError(`assess requires a ${t.kind} target > 0`);
  }
}

/** The sidedness actually used: a limit target with `two` checks the bound on the estimate's side. */
export function effectiveSided(setup: AnalysisSetup, estimate: number | null): Sided {
  if (setup.target?.kind !== 'limit' || setup.sided !== 'two') return setup.sided;
  return estimate !== null && estimate > setup.target.value ? 'lower' : 'upper';
}

function reachedWords(setup: AnalysisSetup): string {
  return setup.population !== undefined ? ` (the population has ${setup.population})` : '';
}

/**
 * Assess a running summary. `values` (entry order) is handed to the stopping rule for rules that look
 * back; pass it when the rule needs it (the app has it at hand).
 */
export function assessSummary(
  summary: RunningSummary,
  setup: AnalysisSetup,
  values: readonly number[] = [],
  options: AssessOptions = {},
): Assessment {
  validateSetup(setup);
  const n = summary.n;
  if (setup.population !== undefined && n > setup.population)
    throw new RangeError('assess requires n <= population');
  const model = modelFor(summary, setup);
  const target = setup.target;
  const sided = effectiveSided(setup, model.estimate);
  // details and warnings are built once here and extended in place (copying a dictionary-shaped object
  // per entry cost ~10× the rest of the per-entry path)
  const details: Assessment['details'] = model.details();
  const warnings = model.warnings();
  if (setup.target?.kind === 'limit' && setup.sided === 'two') details.sidedChosen = sided;

  let interval: Interval | null = model.intervalAt ? model.intervalAt(setup.level, sided) : null;
  let level = setup.level;
  let verdict: Verdict;
  let ruleLabel: string | null = null;

  if (summary.censored > 0 && setup.kind === 'measurement') {
    verdict = {
      status: 'keep going',
      reason: 'not-supportable',
      message: `${summary.censored} value(s) are below a reporting limit; non-detects are not supported by this build, so no verdict is given.`,
    };
    interval = null;
    warnings.push('Values below a reporting limit were left out of the figures shown.');
  } else if (n < setup.min) {
    verdict = {
      status: 'keep going',
      reason: 'below-minimum',
      message: `Fewer than the minimum of ${setup.min} observations; no verdict before then.`,
    };
  } else if (model.guard !== null) {
    verdict = { status: 'keep going', reason: model.guard.reason, message: model.guard.message };
  } else if (target === undefined) {
    verdict = {
      status: 'keep going',
      reason: 'no-target',
      message: 'No target set: the interval is shown only.',
    };
  } else if (model.intervalAt === null) {
    verdict = {
      status: 'keep going',
      reason: 'not-supportable',
      message: 'Too few observations for an interval.',
    };
  } else {
    const intervalAt = model.intervalAt;
    const ctx: RuleContext = {
      kind: setup.kind,
      n,
      intervalAt,
      check: (iv) => checkTarget(target, iv, sided),
      stats: {
        total: summary.total,
        mean: summary.mean,
        sd: summary.sd,
        logMean: summary.positive === n && n >= 1 ? summary.logMean : null,
        logSd: summary.positive === n && n >= 2 ? summary.logSd : null,
      },
      values,
    };
    if (options.projection === false) ctx.verdictOnly = true;
    const decision = decide(ctx, { ...setup, sided });
    interval = decision.interval;
    level = decision.reportedLevel;
    ruleLabel = decision.ruleLabel;
    if (decision.status === 'keep going')
      verdict = {
        status: 'keep going',
        reason: target.kind === 'limit' ? 'undecided' : 'target-not-met',
        message: decision.message,
      };
    else verdict = { status: decision.status, message: decision.message };
  }

  // figures of the reported interval
  if (interval !== null) {
    const hw = halfWidth(interval, sided);
    if (Number.isFinite(hw)) details.halfWidth = hw;
    if (Number.isFinite(hw) && interval.estimate > 0) details.relativeHalfWidth = hw / interval.estimate;
    if (interval.se !== undefined) {
      details.se = interval.se;
      if (interval.estimate > 0) details.precision = interval.se / interval.estimate;
    }
  }
  if (ruleLabel !== null) details.rule = ruleLabel;

  let more: More | null = null;
  if (
    target !== undefined &&
    verdict.status === 'keep going' &&
    options.projection !== false &&
    options.more !== false
  ) {
    more = projectMore(model, setup, level, sided, n, details, warnings, options.previous ?? null);
  }

  const reasonCode = verdict.status === 'keep going' ? verdict.reason : null;
  if (reasonCode !== null) details.reasonCode = reasonCode;
  return {
    kind: setup.kind,
    n,
    estimate: finiteOrNull(interval?.estimate ?? model.estimate ?? undefined),
    lower: interval ? finiteOrNull(interval.lower) : null,
    upper: interval ? finiteOrNull(interval.upper) : null,
    level,
    sided,
    method: model.method,
    methodLabel: model.label(level, sided) + (ruleLabel ? `; stopping rule: ${ruleLabel}` : ''),
    verdict,
    more,
    details,
    warnings,
  };
}

function projectMore(
  model: KindModel,
  setup: AnalysisSetup,
  level: number,
  sided: Sided,
  n: number,
  details: Assessment['details'],
  warnings: string[],
  previous: Assessment | null,
): More | null {
  const target = setup.target;
  if (target === undefined) return null;
  const cap = setup.population;
  if (n < setup.min) {
    const m = setup.min - n;
    return { likely: m, low: m, high: m, atLeast: true };
  }
  const raw = model.project(target, level, sided);
  if (raw === null) {
    details.moreUnavailable = 'no projection can be made from these values yet';
    return null;
  }
  details.moreBasis = raw.basis;
  const clampTotal = (x: number): number => (cap === undefined ? x : Math.min(x, cap));
  let likelyTotal = clampTotal(Math.ceil(raw.likely - 1e-9));
  let lowTotal = clampTotal(Math.ceil(raw.low - 1e-9));
  let highTotal = clampTotal(Math.ceil(raw.high - 1e-9));
  if (!Number.isFinite(likelyTotal)) {
    details.moreUnavailable = 'the projection is unbounded (the estimate sits on the target)';
    return null;
  }
  if (previous?.more && !previous.more.atLeast && previous.n < n && previous.n >= setup.min) {
    // Relative to the previous entry's raw projection (not its smoothed one), so the clamp depends on one
    // step only: loading a study or assessing a file needs two assessments, not a replay of every entry.
    const prevRaw =
      typeof previous.details.moreRawLikely === 'number'
        ? previous.details.moreRawLikely
        : previous.more.likely;
    const prevTotal = previous.n + prevRaw;
    const lo = Math.max(n, Math.floor(prevTotal / SMOOTH_FACTOR));
    const hi = Math.ceil(prevTotal * SMOOTH_FACTOR);
    const clamped = Math.min(hi, Math.max(lo, likelyTotal));
    if (clamped !== likelyTotal) {
      details.moreSmoothed = true;
      details.moreRawLikely = Math.max(0, likelyTotal - n);
      likelyTotal = clamped;
    }
  }
  lowTotal = Math.min(lowTotal, likelyTotal);
  highTotal = Math.max(highTotal, likelyTotal);
  const more: More = {
    likely: Math.max(0, likelyTotal - n),
    low: Math.max(0, lowTotal - n),
    high: Math.max(0, Number.isFinite(highTotal) ? highTotal - n : Number.MAX_SAFE_INTEGER),
  };
  if (raw.assured !== undefined && Number.isFinite(raw.assured))
    more.assured = Math.max(0, clampTotal(Math.ceil(raw.assured - 1e-9)) - n);
  if (cap !== undefined && likelyTotal >= cap)
    warnings.push(`The projection reaches the whole population${reachedWords(setup)}.`);
  if (setup.max !== undefined && likelyTotal > setup.max)
    warnings.push(`The projected total (${likelyTotal}) is above the planned maximum of ${setup.max}.`);
  return more;
}

/**
 * Assess a list of points (batch form used by the command line). Feeds the entries through a
 * RunningSummary and assesses at the last two, so the smoothed projection is the one the app shows.
 */
export function assess(points: readonly Point[], setup: AnalysisSetup): Assessment {
  validateSetup(setup);
  // Field designs (strata, primary units, composites, non-detects): src/design (issue 7).
  if (usesDesign(points, setup)) return assessDesign(points, setup);
  const summary = new RunningSummary();
  const values: number[] = [];
  let previous: Assessment | null = null;
  const last = points.length - 1;
  points.forEach((p, i) => {
    summary.add(p);
    if (!p.censored) values.push(p.value);
    // the smoothed projection looks one entry back (see projectMore)
    if (i === last - 1 && setup.target !== undefined && summary.n >= setup.min && summary.censored === 0) {
      previous = assessSummary(summary, setup, values);
      if (previous.verdict.status !== 'keep going') previous = null;
    }
  });
  return assessSummary(summary, setup, values, { previous });
}
