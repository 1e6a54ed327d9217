/**
 * Targets against intervals: the half-width a target is judged on, whether an interval meets the target,
 * and the sidedness a limit decision actually checks. Shared by the pipeline, the replay loop and every
 * estimator, so "enough" means the same on every surface.
 */
import type { Interval, TargetCheck } from '../model/interval.ts';
import type { AnalysisSetup, Sided, Target } from '../model/types.ts';

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
      return interval.se !== undefined &&
        interval.se > 0 &&
        interval.estimate > 0 &&
        interval.se / interval.estimate <= target.value
        ? 'met'
        : 'not-met';
    case 'limit':
      if (interval.upper < target.value) return 'below';
      if (interval.lower > target.value) return 'above';
      return 'undecided';
  }
}

/** The sidedness actually used: a limit target with `two` checks the bound on the estimate's side. */
export function effectiveSided(setup: AnalysisSetup, estimate: number | null): Sided {
  if (setup.target?.kind !== 'limit' || setup.sided !== 'two') return setup.sided;
  return estimate !== null && estimate > setup.target.value ? 'lower' : 'upper';
}
