/**
 * The one assessment pipeline: an estimator's view of the entries → the verdict ladder → the stopping rule
 * (src/stop decides; this file hands it a RuleContext) → the result → "how many more". Every data kind and
 * every field design goes through it, on every surface (phone, report file, `assess`, `replay`).
 *
 * The verdict ladder, in order (the first that applies gives `keep going` with its reason):
 *   1. the estimator cannot support any estimate (`not-supportable`: e.g. more than half non-detects);
 *   2. fewer entries than the minimum (`below-minimum`; composites need three replicates, not setup.min),
 *      worded by the design's own shortfall when it has one (a stratum short of two entries…);
 *   3. the estimator's own guard (one distinct value, zero spread, all-zero counts, a stratum or primary
 *      unit short of two, a single composite);
 *   4. no target (`no-target`), or no interval yet (`not-supportable`);
 *   5. the stopping rule's decision: `enough`, `below limit`, `above limit`, or `target-not-met` /
 *      `undecided`.
 * Pass/fail items with one outcome so far never say `enough` for margin, relative or precision targets
 * (the pass/fail estimator's guard), while a limit may still be decided (zero-acceptance, 1 − α^(1/n)).
 */
import type { Interval } from '../model/interval.ts';
import { METHODS_BY_KIND, SETUP_DEFAULTS } from '../model/setup-lists.ts';
import type { AnalysisSetup, Assessment, MethodName, More, Verdict } from '../model/types.ts';
import { hotSpotDetection } from '../stats/hot-spot-detection.ts';
import {
  decide,
  HOT_SPOT_DETECTION,
  minimumBeforeVerdict,
  type RuleContext,
  standardLevel,
} from '../stop/index.ts';
import type { SpreadJump } from './entries.ts';
import type { Estimator } from './estimator.ts';
import { type MoreMemory, projectMore } from './more.ts';
import { checkTarget, effectiveSided, halfWidth } from './target.ts';

/** Default minimum number of entries before any verdict other than `keep going`. */
export const DEFAULT_MIN = 10;

/** The entries so far as the pipeline sees them: the estimator plus what the stopping rules read. */
export interface Subject {
  estimator: Estimator;
  /** Counted entries (non-detects included). */
  n: number;
  /** Sufficient statistics some rules need (SPRT on totals or log means, Stein's pilot). */
  stats: RuleContext['stats'];
  /** The entries' values in entry order (rules that look back read them); do not mutate. */
  values: readonly number[];
  /** The first entry whose arrival doubled the spread (entries.ts, SpreadJump), or null. */
  spreadJump?: SpreadJump | null;
}

export interface AssessOptions {
  /** The previous entry's raw "more" projection, for smoothing (see more.ts). */
  memory?: MoreMemory | null;
  /**
   * False: the caller needs only the verdict (replay, benchmark): skip "how many more" and let the rule skip
   * its expensive reported interval while the verdict is `keep going`. Default true.
   */
  projection?: boolean;
  /** False: skip "how many more" only, everything else exact (the running chart's points). Default true. */
  more?: boolean;
}

export interface PipelineResult {
  assessment: Assessment;
  /** What the next entry's smoothing looks back to (null when no projection was made). */
  memory: MoreMemory | null;
}

function finiteOrNull(x: number | undefined): number | null {
  return x !== undefined && Number.isFinite(x) ? x : null;
}

function keepGoing(reason: Extract<Verdict, { status: 'keep going' }>['reason'], message: string): Verdict {
  return { status: 'keep going', reason, message };
}

/** The measurement method the estimator used when the setup left the choice to the data, else undefined. */
export function chosenMethod(setup: AnalysisSetup, used: string): MethodName | undefined {
  if (setup.kind !== 'measurement' || (setup.method !== undefined && setup.method !== 'auto'))
    return undefined;
  return METHODS_BY_KIND.measurement.includes(used as MethodName) ? (used as MethodName) : undefined;
}

/** Why no verdict yet: the minimum, and the hot-spot share when that is what sets it. */
function belowMinimumMessage(min: number, setup: AnalysisSetup): string {
  const share = setup.hotSpotShare ?? SETUP_DEFAULTS.hotSpotShare;
  const byShare = min > setup.min;
  return byShare
    ? `Fewer than the minimum of ${min} entries; no verdict before then (${min} random entries find an area of ${+(share * 100).toPrecision(3)} % of the site or lot with 95 % probability).`
    : `Fewer than the minimum of ${min} entries; no verdict before then.`;
}

/** Assesses the subject under a setup that has already passed the setup validator (running.ts checks it). */
export function runPipeline(
  subject: Subject,
  setup: AnalysisSetup,
  options: AssessOptions = {},
): PipelineResult {
  const { estimator, n } = subject;
  if (setup.population !== undefined && n > setup.population)
    throw new RangeError('assess requires n <= population');
  const target = setup.target;
  // composites set their own minimum (replicates, each made of many increments over the whole area, so the
  // hot-spot argument for single entries does not apply); otherwise the larger of min and the hot-spot share's
  const min = estimator.min ?? minimumBeforeVerdict(setup);
  const sided = effectiveSided(setup, estimator.estimate);
  // details and warnings are built once here and extended in place (copying a dictionary-shaped object
  // per entry cost ~10× the rest of the per-entry path)
  const details = estimator.details();
  const warnings = estimator.warnings();
  if (target?.kind === 'limit' && setup.sided === 'two') details.sidedChosen = sided;
  details.minimum = min;
  if (estimator.min === undefined && n >= 1) {
    details.hotSpotShare = setup.hotSpotShare ?? SETUP_DEFAULTS.hotSpotShare;
    details.unseenShare = hotSpotDetection.unseenShare(n, HOT_SPOT_DETECTION);
  }
  const jump = subject.spreadJump;
  if (jump) {
    details.spreadJumpEntry = jump.entry;
    details.spreadJumpValue = jump.value;
    details.spreadJumpRatio = jump.ratio;
    warnings.push(
      `HOT SPOT? Entry ${jump.entry} (${jump.value}) more than doubled the spread of the values before it (SD ×${jump.ratio.toFixed(1)}): a small area of much higher values may be present. Look at where it was taken, and consider more entries there or strata.`,
    );
  }

  let interval: Interval | null = estimator.intervalAt ? estimator.intervalAt(setup.level, sided) : null;
  let level = setup.level;
  let ruleLabel: string | null = null;
  const guard = estimator.guard;
  let verdict: Verdict;
  if (guard !== null && guard.reason === 'not-supportable') verdict = keepGoing(guard.reason, guard.message);
  else if (n < min)
    // a design's own shortfall (a stratum or primary unit short of two, a single composite) says more
    verdict =
      guard?.reason === 'below-minimum'
        ? keepGoing(guard.reason, guard.message)
        : keepGoing('below-minimum', belowMinimumMessage(min, setup));
  else if (guard !== null) verdict = keepGoing(guard.reason, guard.message);
  else if (target === undefined)
    verdict = keepGoing('no-target', 'No target set: the interval is shown only.');
  else if (estimator.intervalAt === null)
    verdict = keepGoing('not-supportable', 'Too few entries for an interval.');
  else {
    const ctx: RuleContext = {
      kind: setup.kind,
      n,
      intervalAt: estimator.intervalAt,
      check: (iv) => checkTarget(target, iv, sided),
      stats: subject.stats,
      values: subject.values,
    };
    if (options.projection === false) ctx.verdictOnly = true;
    let ruleSetup: AnalysisSetup = { ...setup, sided };
    // the standard rule's correction and strict's plan depend on the interval family actually used: the one
    // the data chose (method auto). The limit decision keeps its own family (the setup's), so that its lines
    // do not move with the choice.
    const chosen = chosenMethod(setup, estimator.method);
    if (chosen !== undefined && setup.rule !== 'sprt') {
      ruleSetup.method = chosen;
      ctx.methodChosen = true;
    }
    if (setup.rule === 'sprt' && estimator.sprtApplies === false) {
      ruleSetup = { ...ruleSetup, rule: 'naive' };
      warnings.push(
        'The SPRT does not apply to design-based estimates; the interval is checked against the limit instead.',
      );
    }
    const decision = decide(ctx, ruleSetup);
    interval = decision.interval;
    level = decision.reportedLevel;
    ruleLabel = decision.ruleLabel;
    verdict =
      decision.status === 'keep going'
        ? keepGoing(target.kind === 'limit' ? 'undecided' : 'target-not-met', decision.message)
        : { status: decision.status, message: decision.message };
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
  let memory: MoreMemory | null = null;
  if (
    target !== undefined &&
    verdict.status === 'keep going' &&
    verdict.reason !== 'not-supportable' &&
    options.projection !== false &&
    options.more !== false
  ) {
    // before the rule has spoken (the minimum, a guard), project at the level the standard rule will check,
    // not the nominal one: a projection at 95 % when the stop is checked at 96.4 % falls short every time
    let projectionLevel = level;
    if (ruleLabel === null && setup.rule === 'standard') {
      const s = subject.stats;
      const dispersion = setup.kind === 'count' && s.mean > 0 ? (s.sd * s.sd) / s.mean : null;
      const chosen = chosenMethod(setup, estimator.method);
      projectionLevel = standardLevel(
        chosen === undefined ? setup : { ...setup, method: chosen },
        s.logSd,
        dispersion,
        n,
        chosen !== undefined,
      );
    }
    const out = projectMore(
      estimator,
      setup,
      min,
      projectionLevel,
      sided,
      n,
      details,
      warnings,
      options.memory ?? null,
    );
    more = out.more;
    memory = out.memory;
  }
  if (verdict.status === 'keep going') details.reasonCode = verdict.reason;
  return {
    assessment: {
      kind: setup.kind,
      n,
      estimate: finiteOrNull(interval?.estimate ?? estimator.estimate ?? undefined),
      lower: interval ? finiteOrNull(interval.lower) : null,
      upper: interval ? finiteOrNull(interval.upper) : null,
      level,
      sided,
      method: estimator.method,
      methodLabel: estimator.label(level, sided) + (ruleLabel ? `; stopping rule: ${ruleLabel}` : ''),
      verdict,
      more,
      details,
      warnings,
    },
    memory,
  };
}
