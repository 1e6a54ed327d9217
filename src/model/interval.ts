/**
 * The interval vocabulary every layer shares: an estimate with its bounds (and standard error when the
 * method has one), and the answer to "does this interval meet the target?". It lives in model/ so that the
 * statistics, the stopping rules and the assessment pipeline can all speak it without importing each other.
 */

export interface Interval {
  estimate: number;
  lower: number;
  upper: number;
  /** Standard error of the estimate when the method has one (needed by the `precision` target). */
  se?: number;
}

/** `met` / `not-met` for margin, relative and precision targets; `below` / `above` / `undecided` for a limit. */
export type TargetCheck = 'met' | 'not-met' | 'below' | 'above' | 'undecided';
