/**
 * The contract between the pipeline's fixed-n statistics (src/assess/) and the stopping rules (src/stop/).
 *
 * The pipeline (src/assess/pipeline.ts) first applies the guards every rule shares (minimum n, zero spread, one distinct value,
 * all-zero counts; see the Verdict reasons in src/model/types.ts). Only when they pass does it call
 * `decide`, handing over a RuleContext that can compute the data kind's interval at any level.
 * The rule chooses the level it checks and reports (standard: a calibrated inflated level; strict: a
 * level valid under continuous monitoring; sprt: Wald's boundaries), and returns the verdict.
 */
import type { Interval, TargetCheck } from '../model/interval.ts';
import type { DataKind, Sided, VerdictStatus } from '../model/types.ts';

export type { Interval, TargetCheck } from '../model/interval.ts';

export interface RuleContext {
  kind: DataKind;
  n: number;
  /** The data kind's chosen interval (method from setup) at this confidence level and sidedness. */
  intervalAt(level: number, sided: Sided): Interval;
  /** Whether this interval meets the setup's target (margin / relative / precision / limit). */
  check(interval: Interval): TargetCheck;
  /** Sufficient statistics some rules need (SPRT on totals or log means, Stein's pilot). */
  stats: {
    total: number;
    mean: number;
    sd: number;
    logMean: number | null;
    logSd: number | null;
  };
  /**
   * True when the interval family was chosen from the data at this entry (measurements with method auto,
   * src/assess/method-choice.ts): choosing among intervals after every entry is itself a look at the data, so
   * the standard rule corrects for it (standard-level.ts, CHOICE_ALPHA_FACTOR).
   */
  methodChosen?: boolean;
  /** The observations in entry order (for rules that look back, e.g. Stein's pilot); do not mutate. */
  values: readonly number[];
  /**
   * True when the caller needs only the verdict (replay, benchmark): while the verdict is `keep going`
   * a rule may then skip computing an expensive reported interval and return the nominal one.
   */
  verdictOnly?: boolean;
  /**
   * True only inside replay's per-entry loop (src/assess/replay.ts), which needs nothing but whether the
   * rule stops at this entry and recomputes the full assessment where it stops or ends: a `keep going`
   * decision may then carry a placeholder interval, level and message (standard.ts uses it to skip the
   * quantile inversion at a data-dependent level). Implies verdictOnly.
   */
  stopOnly?: boolean;
  /**
   * Stop-only and optional: an interval that intervalAt(level, sided) is sure to contain, found without
   * solving for its limits (exact Poisson counts: garwood-poisson-bracket.ts; Land: land-inner-bounds.ts),
   * tighter with each tier (0, 1, …), or null when none is at hand at that tier. When one does not meet the
   * target, neither does the rule's own interval, so a `keep going` is settled without it; any other
   * answer is decided on the exact interval (inner-keep-going.ts).
   */
  innerIntervalAt?: (level: number, sided: Sided, tier: number) => Interval | null;
}

export interface RuleDecision {
  status: VerdictStatus;
  /** The interval the rule reports (at `reportedLevel`). */
  interval: Interval;
  reportedLevel: number;
  message: string;
  /** Plain-words name of the rule, for the method statement. */
  ruleLabel: string;
}
