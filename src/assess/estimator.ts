/**
 * The per-data-kind view of a running summary that src/assess.ts works with: the estimate, the interval
 * at any level and sidedness (for the stopping rule), the kind's own guards, and the raw projection of the
 * total number of observations a target needs. Glue, not a published method: each piece it uses lives in
 * its own file with its source.
 */
import type { Sided, Target } from '../../model/types.ts';
import type { Interval } from '../../model/interval.ts';

export type GuardReason = 'one-distinct-value' | 'zero-spread' | 'all-zero' | 'not-supportable';

/** Projected total numbers of observations (not further ones): likely, 10th–90th percentile, 80 % assured. */
export interface Projection {
  likely: number;
  low: number;
  high: number;
  assured?: number;
  /** How the projection was made (shown in details). */
  basis: string;
}

/** The figures shown with an assessment (Assessment.details). */
export type Details = Record<string, number | string | boolean | null>;

export interface KindModel {
  /** Published name of the method actually used (CLI `method` field). */
  method: string;
  label(level: number, sided: Sided): string;
  estimate: number | null;
  /** null when too few observations for an interval. */
  intervalAt: ((level: number, sided: Sided) => Interval) | null;
  /** Kind-specific reason why no verdict other than `keep going` may be given, or null. */
  guard: { reason: GuardReason; message: string } | null;
  /**
   * The figures shown with the assessment, built when called (a fresh object each call; assess extends
   * it). Replay and the benchmark never call it, so the per-entry path builds no details.
   */
  details(): Details;
  /** The kind's warnings (a fresh array each call; assess appends to it). */
  warnings(): string[];
  /** Raw projection of the total n for the target (null when it cannot be made). */
  project(target: Target, level: number, sided: Sided): Projection | null;
}

export function quantileProbability(level: number, sided: Sided): number {
  return sided === 'two' ? 1 - (1 - level) / 2 : level;
}

const wordsCache = new Map<string, string>();

/** "95 % two-sided", "90 % upper bound"… (memoised: it runs after every entry). */
export function sidedWords(level: number, sided: Sided): string {
  const key = `${level}|${sided}`;
  const hit = wordsCache.get(key);
  if (hit !== undefined) return hit;
  const pct = `${Number((level * 100).toFixed(4))} %`;
  const words =
    sided === 'two' ? `${pct} two-sided` : sided === 'upper' ? `${pct} upper bound` : `${pct} lower bound`;
  if (wordsCache.size > 1000) wordsCache.clear();
  wordsCache.set(key, words);
  return words;
}
