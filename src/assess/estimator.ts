/**
 * The one seam every estimator plugs into: the three data kinds (estimators/measurement.ts, count.ts,
 * pass-fail.ts) and every field design (estimators/stratified.ts, primary-units.ts, composites.ts,
 * non-detects.ts). An estimator is a view of the entries so far: the estimate, the interval at any level and
 * sidedness (the stopping rule picks the level), its own guards, and the raw projection of the total number
 * of entries a target needs. The pipeline (pipeline.ts) does everything else once for all of them: the
 * verdict ladder, the stopping rule, the result assembly and "how many more". Glue, not a published method:
 * each piece an estimator uses lives in its own file with its source.
 */
import type { Interval } from '../model/interval.ts';
import type { MethodChoice, Sided, Target, Verdict } from '../model/types.ts';

/** Why an estimator refuses a verdict for now (a `keep going` reason of the Verdict union). */
export type GuardReason = Extract<Verdict, { status: 'keep going' }>['reason'];

export interface Guard {
  reason: GuardReason;
  message: string;
}

/** Projected total numbers of entries (not further ones): likely, 10th–90th percentile, 80 % assured. */
export interface Projection {
  likely: number;
  low: number;
  high: number;
  assured?: number;
  /** How the projection was made (shown in details). */
  basis: string;
}

/** The figures shown with an assessment (Assessment.details). */
export type Details = Record<string, number | string | boolean | null | MethodChoice>;

export interface Estimator {
  /** Published name of the method actually used (CLI `method` field). */
  method: string;
  label(level: number, sided: Sided): string;
  estimate: number | null;
  /** null when too few entries for an interval. */
  intervalAt: ((level: number, sided: Sided) => Interval) | null;
  /** The estimator's own reason why no verdict other than `keep going` may be given, or null. */
  guard: Guard | null;
  /**
   * The figures shown with the assessment, built when called (a fresh object each call; the pipeline extends
   * it). Replay and the benchmark never call it, so the per-entry path builds no details.
   */
  details(): Details;
  /** The estimator's warnings (a fresh array each call; the pipeline appends to it). */
  warnings(): string[];
  /** Raw projection of the total number of entries the target needs (null when it cannot be made). */
  project(target: Target, level: number, sided: Sided): Projection | null;
  /** Entries before any verdict when the design sets its own (composites: three replicates); else setup.min. */
  min?: number;
  /**
   * False for design-based estimates: Wald's SPRT needs the likelihood of single entries, which a stratified,
   * primary-unit, composite or censored estimate does not give, so the limit is checked by the interval.
   */
  sprtApplies?: boolean;
}

/** The guard of a data kind whose entries so far all hold one value: no spread to judge. */
export function oneValueGuard(what: 'value' | 'count'): Guard {
  return {
    reason: 'one-distinct-value',
    message: `Every ${what} is the same; the spread cannot be judged yet.`,
  };
}

export function quantileProbability(level: number, sided: Sided): number {
  return sided === 'two' ? 1 - (1 - level) / 2 : level;
}

const wordsCache = new Map<string, string>();

/**
 * "95 % two-sided", "95.5 % upper bound"… for method labels (memoised: it runs after every entry). One
 * decimal is enough to tell a rule's checked level from the chosen one; two above 99.5 % so that 99.95 %
 * does not read as 100 %.
 */
export function sidedWords(level: number, sided: Sided): string {
  const key = `${level}|${sided}`;
  const hit = wordsCache.get(key);
  if (hit !== undefined) return hit;
  const pct = `${Number((level * 100).toFixed(level >= 0.995 ? 2 : 1))} %`;
  const words =
    sided === 'two' ? `${pct} two-sided` : sided === 'upper' ? `${pct} upper bound` : `${pct} lower bound`;
  if (wordsCache.size > 1000) wordsCache.clear();
  wordsCache.set(key, words);
  return words;
}
