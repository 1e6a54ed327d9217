/**
 * The shared vocabulary of the core (src/model/README.md: study, data kind, target, stopping rule, verdict,
 * more).
 * Every module of src/ and web/ speaks these types; change them only with care — the CLI JSON, the study
 * bundle and the stored setup all follow from them.
 */

/** `measurement` (a number with a unit), `count` (whole number per plot), `pass-fail` (one item: 1 = the counted outcome). */
export type DataKind = 'measurement' | 'count' | 'pass-fail';

/** Two-sided interval, or a one-sided upper / lower bound. */
export type Sided = 'two' | 'upper' | 'lower';

/** Interval methods by their published names (CLI `--method`). */
/** `auto` (the default): the interval is chosen from the data (src/assess/method-choice.ts). */
export type MeasurementMethod = 'auto' | 't' | 'johnson-t' | 'gamma' | 'cox' | 'land' | 'chebyshev';
export type CountMethod = 't' | 'poisson-exact' | 'quasi-poisson';
export type PassFailMethod = 'wilson' | 'wilson-cc' | 'jeffreys' | 'clopper-pearson' | 'agresti-coull';
export type MethodName = MeasurementMethod | CountMethod | PassFailMethod;

/**
 * What "enough" means.
 * - margin: interval half-width ≤ value, in the data's units (per plot for counts, proportion for pass/fail)
 * - relative: half-width ≤ value × estimate (value is a fraction, 0.2 = ±20 %)
 * - precision: SE / mean ≤ value — the ecologists' D, not a half-width (r = z·D)
 * - limit: decide whether the mean / rate is below or above `value` (one-sided bounds or an SPRT)
 */
export type Target =
  | { kind: 'margin'; value: number }
  | { kind: 'relative'; value: number }
  | { kind: 'precision'; value: number }
  | { kind: 'limit'; value: number; source?: string; date?: string };

/**
 * - standard: guarded sequential rule with a measured correction for looking after every entry
 * - strict: valid however often you look (Stein two-stage / confidence sequence)
 * - sprt: Wald's sequential probability ratio test against a limit
 * - naive: stop the first time the fixed-n interval meets the target (for comparison in replay / bench only)
 */
export type RuleName = 'standard' | 'strict' | 'sprt' | 'naive';

/** Wald SPRT settings: error rates and the indifference zone [lowerBound, upperBound] around the limit. */
export interface SprtSettings {
  alpha: number;
  beta: number;
  lowerBound: number;
  upperBound: number;
  maxN?: number;
}

/** Planning coefficients a crew may know for its organism / habitat (counts). */
export interface CountPlanning {
  negBinomialK?: number;
  taylorA?: number;
  taylorB?: number;
  iwaoAlpha?: number;
  iwaoBeta?: number;
}

/** Everything the statistics need to know about a study (a subset of the stored study setup). */
export interface AnalysisSetup {
  kind: DataKind;
  /** Confidence level, 0 < level < 1. */
  level: number;
  sided: Sided;
  /** Interval method; the data kind's default when absent. */
  method?: MethodName;
  target?: Target;
  rule: RuleName;
  /** Observations before any verdict other than `keep going` (default 10; see hotSpotShare). */
  min: number;
  /**
   * The smallest share of the site or lot that must not go unseen (a fraction, default 0.10): no verdict
   * before the entries would hit an area of that share with 95 % probability (29 entries for 10 %). The
   * minimum before a verdict is the larger of this and `min` (src/stop/minimum.ts).
   */
  hotSpotShare?: number;
  /** Finite population / lot size (sampling without replacement). */
  population?: number;
  /** Plot area for counts; densities are per unit of this area. */
  plotArea?: number;
  /** Planned maximum number of observations (also the SPRT truncation when sprt.maxN is absent). */
  max?: number;
  planning?: CountPlanning;
  sprt?: SprtSettings;
  /** Declared strata (issue 7, src/design): the estimate becomes the stratified mean. */
  strata?: StratumSetup[];
  /** `composite`: each entry is one composite / incremental sample; the bound comes from the replicates. */
  design?: 'composite';
  /** Non-detects: Kaplan–Meier (default) or, only where a regulation prescribes it, half the reporting limit. */
  nonDetects?: 'kaplan-meier' | 'half-limit';
}

/** One stratum of a stratified study: weight = area share or number of units (rescaled to sum to 1). */
export interface StratumSetup {
  name: string;
  weight: number;
  /** Effort of one entry in this stratum (any unit, e.g. minutes); default 1. */
  cost?: number;
  /** Number of units in the stratum (finite population correction), when known. */
  population?: number;
}

/** One observation as the core sees it. */
export interface Point {
  value: number;
  /** True when the value is a reporting limit and the result was below it (non-detect, `<RL`). */
  censored?: boolean;
  stratum?: string;
  /** Primary unit (transect, room, composite) the entry belongs to. */
  cluster?: string;
}

export type VerdictStatus = 'keep going' | 'enough' | 'below limit' | 'above limit';

/** Why the verdict is what it is. `keep going` always carries the reason code the UI can explain. */
export type Verdict =
  | {
      status: 'keep going';
      reason:
        | 'no-target'
        | 'below-minimum'
        | 'zero-spread'
        | 'one-distinct-value'
        | 'all-zero'
        | 'not-supportable'
        | 'target-not-met'
        | 'undecided';
      message: string;
    }
  | { status: 'enough'; message: string }
  | { status: 'below limit'; message: string }
  | { status: 'above limit'; message: string };

/** "About N more (likely N1–N2)": further observations, not totals. */
export interface More {
  likely: number;
  low: number;
  high: number;
  /** Further observations that reach the target with 80 % assurance (Kupper & Hafner 1989). */
  assured?: number;
  /** True when this is only "at least M more" (before the minimum). */
  atLeast?: boolean;
}

/** Which interval the data chose (method `auto`), why, and the figures of the criterion. */
export interface MethodChoice {
  method: MethodName;
  reason: string;
  criterion: Record<string, number | null>;
}

/** The result of assessing a study's observations. Numbers are unrounded. */
export interface Assessment {
  kind: DataKind;
  n: number;
  estimate: number | null;
  lower: number | null;
  upper: number | null;
  level: number;
  sided: Sided;
  method: string;
  /** Plain-words name of the method actually used, e.g. "Student t, 95 % two-sided". */
  methodLabel: string;
  verdict: Verdict;
  more: More | null;
  /** Extra figures the UI may show (sd, dispersion index, densities, relative precision…). */
  details: Record<string, number | string | boolean | null | MethodChoice>;
  /** Plain-language warnings for this regime (e.g. heavy skew, many non-detects). */
  warnings: string[];
}
